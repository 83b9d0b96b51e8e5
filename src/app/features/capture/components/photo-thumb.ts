import { HttpClient } from '@angular/common/http';
import { Component, effect, inject, input, signal, type OnDestroy } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { TranslocoPipe } from '@jsverse/transloco';
import type { LocalPhoto } from '../../../core/db/heapsight-db';

/**
 * A list thumbnail: the device's own copy when it has one, else the server's thumbnail fetched with
 * the sign-in (a plain image URL would carry no token), else a photo icon while offline.
 */
@Component({
  selector: 'hs-photo-thumb',
  imports: [MatIconModule, TranslocoPipe],
  template: `@if (photo()) { @if (source(); as src) { <img [src]="src" [alt]="'captureParts.photo' | transloco" width="48" height="48" /> } @else { <mat-icon class="placeholder" [attr.aria-label]="'captureParts.photoOnServer' | transloco">image</mat-icon> } }`,
  styles: `img { object-fit: cover; border-radius: 8px; } .placeholder { width: 48px; height: 48px; font-size: 32px; display: grid; place-items: center; }`,
})
export class PhotoThumb implements OnDestroy {
  readonly photo = input<LocalPhoto | null>(null);
  private readonly http = inject(HttpClient);
  protected readonly source = signal<string | null>(null);
  private objectUrl: string | null = null;

  constructor() {
    effect((onCleanup) => {
      const photo = this.photo();
      this.show(null);
      if (!photo) {
        return;
      }
      if (photo.thumbnail instanceof Blob) {
        this.show(URL.createObjectURL(photo.thumbnail));
        return;
      }
      const request = this.http.get(`/api/photos/${photo.id}`, { params: { size: 'thumb' }, responseType: 'blob' }).subscribe({
        next: (blob) => this.show(URL.createObjectURL(blob)),
        error: () => this.show(null),
      });
      onCleanup(() => request.unsubscribe());
    });
  }

  ngOnDestroy(): void {
    this.show(null);
  }

  private show(objectUrl: string | null): void {
    if (this.objectUrl) {
      URL.revokeObjectURL(this.objectUrl);
    }
    this.objectUrl = objectUrl;
    this.source.set(objectUrl);
  }
}
