import { formatNumber } from '@angular/common';
import { Component, inject, input, output, signal } from '@angular/core';
import { TranslocoPipe, TranslocoService } from '@jsverse/transloco';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { toApiProblem } from '../../../../core/http/api-error';
import { AppLanguage } from '../../../../i18n/app-language';
import { LOCALE_FORMAT_PIPES } from '../../../../i18n/locale-format.pipes';
import { CORNER_FIELDS, checkImageCorners, type CornerField, type CornerProblem } from '../../image-corners';
import { SiteMapStore, type MapImage, type UploadCorners } from '../../site-map.store';

/** The image types the server takes (DESIGN §5 photos; the same list for site images). */
const ACCEPTED_TYPES = ['image/jpeg', 'image/png', 'image/webp'];
/** The server's limit for one site image, in bytes. */
const MAX_BYTES = 16 * 1024 * 1024;

/** What is wrong with a field: our own words (a key and figures) or the server's words as it sent them. */
type FieldProblem = CornerProblem | { readonly text: string };

/** Admins: upload the georeferenced site picture with its four edges, checked here before it is sent. */
@Component({
  selector: 'hs-site-image-form',
  imports: [TranslocoPipe, LOCALE_FORMAT_PIPES, MatButtonModule, MatIconModule],
  templateUrl: './site-image-form.html',
  styleUrl: './site-image-form.scss',
})
export class SiteImageForm {
  private readonly store = inject(SiteMapStore);
  private readonly transloco = inject(TranslocoService);
  private readonly language = inject(AppLanguage);
  /** The site the picture belongs to. */
  readonly siteId = input.required<string>();
  /** The picture stored now, whose corners fill the form. */
  readonly current = input<MapImage | null>(null);
  /** The box the map shows now, offered as corners. */
  readonly viewBox = input<UploadCorners | null>(null);
  /** The stored image record, once the server has taken the upload. */
  readonly uploaded = output<MapImage>();

  protected readonly fields = CORNER_FIELDS;
  protected readonly values = signal<Record<CornerField, string>>({ north: '', west: '', east: '', south: '' });
  protected readonly errors = signal<Partial<Record<CornerField | 'file', FieldProblem>>>({});
  protected readonly file = signal<File | null>(null);
  protected readonly isSending = signal(false);
  /** The server's refusal, in its words. */
  protected readonly problem = signal<string | null>(null);
  /** The translation key of what was saved. */
  protected readonly done = signal<string | null>(null);

  /** A field's problem in the active language, its figures in the locale's digits. */
  protected say(problem: FieldProblem): string {
    if ('text' in problem) return problem.text;
    const locale = this.language.locale();
    const params = Object.fromEntries(Object.entries(problem.params ?? {}).map(([name, value]) => [name, formatNumber(value, locale, '1.0-6')]));
    return this.transloco.translate(problem.key, params);
  }

  /** Fills the corners from the stored picture, or from the map's view. */
  protected fillFrom(box: UploadCorners | null): void {
    if (!box) return;
    // Six decimals of a degree are about 0.1 m: finer than any site picture.
    this.values.set({ north: box.north.toFixed(6), west: box.west.toFixed(6), east: box.east.toFixed(6), south: box.south.toFixed(6) });
    this.errors.set({});
  }

  protected setValue(field: CornerField, value: string): void {
    this.values.update((values) => ({ ...values, [field]: value }));
    this.done.set(null);
  }

  protected chooseFile(event: Event): void {
    const picked = (event.target as HTMLInputElement).files?.[0] ?? null;
    this.file.set(picked);
    this.done.set(null);
    this.errors.update((errors) => ({ ...errors, file: picked ? this.fileProblem(picked) : undefined }));
  }

  protected async send(): Promise<void> {
    this.problem.set(null);
    this.done.set(null);
    const file = this.file();
    const check = checkImageCorners(this.values());
    const fileError = file ? this.fileProblem(file) : this.current() ? undefined : { key: 'siteMap.imageForm.fileMissing' };
    const errors = { ...(check.ok ? {} : check.errors), ...(fileError ? { file: fileError } : {}) };
    this.errors.set(errors);
    if (!check.ok || fileError) {
      return;
    }
    this.isSending.set(true);
    try {
      const image = await this.store.uploadImage(this.siteId(), file, check.value);
      this.done.set(file ? 'siteMap.imageForm.savedPicture' : 'siteMap.imageForm.savedCorners');
      this.uploaded.emit(image);
    } catch (error) {
      const answer = toApiProblem(error);
      const byField: Partial<Record<CornerField, FieldProblem>> = {};
      for (const detail of answer.details) {
        const field = CORNER_FIELDS.find((name) => detail.path === name || detail.path.endsWith(`.${name}`));
        if (field) byField[field] = { text: detail.message };
      }
      this.errors.set(byField);
      this.problem.set(answer.message);
    } finally {
      this.isSending.set(false);
    }
  }

  private fileProblem(file: File): CornerProblem | undefined {
    if (!ACCEPTED_TYPES.includes(file.type)) return { key: 'siteMap.imageForm.fileType' };
    if (file.size > MAX_BYTES) return { key: 'siteMap.imageForm.fileSize', params: { megabytes: MAX_BYTES / 1048576 } };
    return undefined;
  }
}
