import { Component, computed, effect, input, type OnDestroy } from '@angular/core';
import type { LocalPhoto } from '../../../core/db/heapsight-db';

/** A list thumbnail: the device's own copy when it has one, else the server's thumbnail. */
@Component({
  selector: 'hs-photo-thumb',
  template: `@if (source(); as src) { <img [src]="src" alt="Photo" width="48" height="48" /> }`,
  styles: `img { object-fit: cover; border-radius: 8px; }`,
})
export class PhotoThumb implements OnDestroy {
  readonly photo = input<LocalPhoto | null>(null);
  private objectUrl: string | null = null;
  protected readonly source = computed(() => {
    const photo = this.photo();
    if (!photo) {
      return null;
    }
    return photo.thumbnail instanceof Blob ? URL.createObjectURL(photo.thumbnail) : `/api/photos/${photo.id}?size=thumb`;
  });

  constructor() {
    effect(() => {
      const next = this.source();
      if (this.objectUrl && this.objectUrl !== next) {
        URL.revokeObjectURL(this.objectUrl);
      }
      this.objectUrl = next?.startsWith('blob:') ? next : null;
    });
  }

  ngOnDestroy(): void {
    if (this.objectUrl) {
      URL.revokeObjectURL(this.objectUrl);
    }
  }
}
