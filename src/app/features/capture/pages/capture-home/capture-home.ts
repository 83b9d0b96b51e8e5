import { Component, computed, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import { SyncService } from '../../../../core/sync/sync.service';
import { MATERIAL_LABELS, SAMPLE_TYPE_LABELS } from '../../capture-labels';
import { CaptureStore } from '../../capture.store';
import { PhotoThumb } from '../../components/photo-thumb';

/** The crew's home: what waits on this device, and the ways to record a pile, a sample or a pan test. */
@Component({
  selector: 'hs-capture-home',
  imports: [MatButtonModule, MatIconModule, RouterLink, PhotoThumb],
  template: `
    <section class="hs-page">
      <h1>Capture</h1>
      <p class="queue" role="status"><mat-icon aria-hidden="true">cloud_upload</mat-icon> {{ sync.queueSize() }} changes wait on this phone</p>
      <nav class="actions" aria-label="Record">
        <a mat-flat-button routerLink="pile/new"><mat-icon>add_location_alt</mat-icon> New pile</a>
        <a mat-flat-button routerLink="sample/new"><mat-icon>science</mat-icon> New sample</a>
        <a mat-flat-button routerLink="pan-test/new"><mat-icon>filter_vintage</mat-icon> Pan test</a>
      </nav>
      <h2>Piles ({{ store.livePiles().length }})</h2>
      <ul class="records">
        @for (pile of store.livePiles(); track pile.id) {
          <li><hs-photo-thumb [photo]="photoOf(pile.id)" /> <span><strong>{{ pile.code }}</strong> {{ materialLabels[pile.material] }}</span>
            @if (pile.hasPendingChange) { <mat-icon aria-label="waiting to sync">schedule</mat-icon> }</li>
        }
      </ul>
      <h2>Samples ({{ store.samples().length }})</h2>
      <ul class="records">
        @for (sample of store.samples(); track sample.id) {
          <li><hs-photo-thumb [photo]="photoOf(sample.id)" /> <span><strong>{{ sample.code }}</strong> {{ typeLabels[sample.sampleType] }}@if (sample.wetMassKg !== null) {, {{ sample.wetMassKg }} kg}</span>
            @if (sample.hasPendingChange) { <mat-icon aria-label="waiting to sync">schedule</mat-icon> }</li>
        }
      </ul>
      <p>Pan tests: {{ store.panTests().length }}</p>
    </section>
  `,
  styles: `
    .actions { display: flex; flex-wrap: wrap; gap: 8px; }
    .actions a { min-height: 48px; }
    .queue { display: flex; align-items: center; gap: 8px; font: var(--mat-sys-title-small); }
    .records { list-style: none; padding: 0; margin: 0; }
    .records li { display: flex; align-items: center; gap: 12px; min-height: 56px; border-bottom: 1px solid var(--mat-sys-outline-variant); }
  `,
})
export default class CaptureHome {
  protected readonly store = inject(CaptureStore);
  protected readonly sync = inject(SyncService);
  protected readonly materialLabels = MATERIAL_LABELS;
  protected readonly typeLabels = SAMPLE_TYPE_LABELS;
  private readonly photosByOwner = computed(() => new Map(this.store.photos().map((photo) => [photo.ownerId, photo])));

  protected photoOf(ownerId: string) {
    return this.photosByOwner().get(ownerId) ?? null;
  }
}
