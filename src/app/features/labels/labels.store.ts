import { HttpClient, HttpErrorResponse, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { firstValueFrom } from 'rxjs';

/** The codes of a sheet just printed, as the server reserved them. */
export interface PrintedSheet {
  readonly firstCode: string;
  readonly lastCode: string;
  readonly count: number;
}

/** Fetches label sheets; each download reserves new codes on the server, so it needs a connection. */
@Injectable({ providedIn: 'root' })
export class LabelsStore {
  private readonly http = inject(HttpClient);

  /** Downloads a PDF of `count` new labels for a site and hands it to the browser. Throws the API problem. */
  async downloadSheet(siteId: string, count: number): Promise<PrintedSheet> {
    const params = new HttpParams().set('site', siteId).set('count', String(count));
    const response = await firstValueFrom(this.http.get('/api/labels.pdf', { params, responseType: 'blob', observe: 'response' }))
      .catch(async (error: unknown) => {
        throw await withReadableBody(error);
      });
    const filename = /filename="([^"]+)"/.exec(response.headers.get('Content-Disposition') ?? '')?.[1] ?? 'heapsight-labels.pdf';
    const [firstCode, lastCode] = (/heapsight-labels-(.+)-to-(.+)\.pdf/.exec(filename) ?? []).slice(1);
    const url = URL.createObjectURL(response.body as Blob);
    const link = document.createElement('a');
    link.href = url;
    link.download = filename;
    document.body.appendChild(link);
    link.click();
    link.remove();
    // Long enough for the browser to start the download; the blob is then freed.
    setTimeout(() => URL.revokeObjectURL(url), 60_000);
    return { firstCode: firstCode ?? '', lastCode: lastCode ?? '', count };
  }
}

/**
 * A refusal of a blob request carries its `{error: {code, message}}` as a Blob; reads it back into
 * JSON so the screen can tell its code (a site out of codes, a site gone) like any other refusal.
 */
export async function withReadableBody(error: unknown): Promise<unknown> {
  if (!(error instanceof HttpErrorResponse) || !(error.error instanceof Blob)) return error;
  try {
    const body: unknown = JSON.parse(await readText(error.error));
    return new HttpErrorResponse({ error: body, headers: error.headers, status: error.status, statusText: error.statusText, url: error.url ?? undefined });
  } catch {
    return error;
  }
}

/** A Blob's text. FileReader rather than `Blob.text()`, which some engines (jsdom among them) lack. */
function readText(blob: Blob): Promise<string> {
  return new Promise((resolve, reject) => {
    const reader = new FileReader();
    reader.onload = () => resolve(String(reader.result));
    reader.onerror = () => reject(reader.error);
    reader.readAsText(blob);
  });
}
