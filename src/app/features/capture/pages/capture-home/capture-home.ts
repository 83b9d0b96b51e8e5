import { Component, DestroyRef, afterNextRender, computed, effect, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import { TranslocoPipe } from '@jsverse/transloco';
import { liveQuery } from 'dexie';
import { countLive, firstPhotoOf, latestSamples, pilesByCode } from '../../../../core/db/device-queries';
import { heapsightDb, type LocalPhoto, type LocalPile, type LocalSample } from '../../../../core/db/heapsight-db';
import { SyncService } from '../../../../core/sync/sync.service';
import { LOCALE_FORMAT_PIPES } from '../../../../i18n/locale-format.pipes';
import { PhotoThumb } from '../../components/photo-thumb';

/** How many records each list shows at first, and how many more a tap on "Show more" adds. */
export const PILES_PAGE = 30;
export const SAMPLES_PAGE = 20;
/** How long the first screen has the phone to itself before the forms load in the background. */
const WARM_FORMS_AFTER_MS = 3000;

/** What the home screen shows: counts from the indexes and one page of each list, never every row. */
interface Overview {
  readonly pileCount: number;
  readonly sampleCount: number;
  readonly panTestCount: number;
  readonly piles: readonly LocalPile[];
  readonly samples: readonly LocalSample[];
  readonly photos: ReadonlyMap<string, LocalPhoto>;
}

/**
 * The crew's home: what waits on this device, and the ways to record a pile, a sample or a pan test.
 * It reads counts and a page of piles and of the latest samples (so it opens at once on a phone
 * holding tens of thousands of samples), following every change to the device database.
 */
@Component({
  selector: 'hs-capture-home',
  imports: [MatButtonModule, MatIconModule, RouterLink, TranslocoPipe, LOCALE_FORMAT_PIPES, PhotoThumb],
  template: `
    <section class="hs-page">
      <h1>{{ 'common.titles.capture' | transloco }}</h1>
      <p class="queue" role="status"><mat-icon aria-hidden="true">cloud_upload</mat-icon> {{ 'capture.home.queue' | transloco: { count: sync.queueSize() } }}</p>
      <nav class="actions" [attr.aria-label]="'capture.home.recordActions' | transloco">
        <a mat-flat-button routerLink="pile/new"><mat-icon>add_location_alt</mat-icon> {{ 'common.titles.newPile' | transloco }}</a>
        <a mat-flat-button routerLink="sample/new"><mat-icon>science</mat-icon> {{ 'common.titles.newSample' | transloco }}</a>
        <a mat-flat-button routerLink="pan-test/new"><mat-icon>filter_vintage</mat-icon> {{ 'common.titles.panTest' | transloco }}</a>
      </nav>
      @if (overview(); as view) {
        <h2>{{ 'capture.home.piles' | transloco: { count: view.pileCount } }}</h2>
        <ul class="records">
          @for (pile of view.piles; track pile.id) {
            <li><hs-photo-thumb [photo]="view.photos.get(pile.id) ?? null" /> <span><strong>{{ pile.code }}</strong> {{ ('common.terms.material.' + pile.material) | transloco }}</span>
              @if (pile.hasPendingChange) { <mat-icon [attr.aria-label]="'capture.home.waitingToSync' | transloco">schedule</mat-icon> }</li>
          }
        </ul>
        @if (view.piles.length < view.pileCount) {
          <p class="more"><span class="hs-muted">{{ 'capture.home.pilesShown' | transloco: { shown: view.piles.length, count: view.pileCount } }}</span>
            <button mat-stroked-button type="button" (click)="pileLimit.set(pileLimit() + pilesPage)"><mat-icon aria-hidden="true">expand_more</mat-icon> {{ 'capture.home.morePiles' | transloco }}</button></p>
        }
        <h2>{{ 'capture.home.samples' | transloco: { count: view.sampleCount } }}</h2>
        <ul class="records">
          @for (sample of view.samples; track sample.id) {
            <li><hs-photo-thumb [photo]="view.photos.get(sample.id) ?? null" /> <span><strong>{{ sample.code }}</strong> {{ ('common.terms.sampleType.' + sample.sampleType) | transloco }}@if (sample.wetMassKg !== null) {, {{ 'capture.home.wetMass' | transloco: { mass: (sample.wetMassKg | hsNumber: '1.0-2') } }}}</span>
              @if (sample.hasPendingChange) { <mat-icon [attr.aria-label]="'capture.home.waitingToSync' | transloco">schedule</mat-icon> }</li>
          }
        </ul>
        @if (view.samples.length < view.sampleCount) {
          <p class="more"><span class="hs-muted">{{ 'capture.home.samplesShown' | transloco: { shown: view.samples.length, count: view.sampleCount } }}</span>
            <button mat-stroked-button type="button" (click)="sampleLimit.set(sampleLimit() + samplesPage)"><mat-icon aria-hidden="true">expand_more</mat-icon> {{ 'capture.home.moreSamples' | transloco }}</button></p>
        }
        <p>{{ 'capture.home.panTests' | transloco: { count: view.panTestCount } }}</p>
      }
    </section>
  `,
  styles: `
    .actions { display: flex; flex-wrap: wrap; gap: 8px; }
    .actions a { min-height: 48px; }
    .queue { display: flex; align-items: center; gap: 8px; font: var(--mat-sys-title-small); }
    .records { list-style: none; padding: 0; margin: 0; }
    .records li { display: flex; align-items: center; gap: 12px; min-height: 56px; border-bottom: 1px solid var(--mat-sys-outline-variant); }
    .more { display: flex; flex-wrap: wrap; align-items: center; gap: 8px 12px; }
  `,
})
export default class CaptureHome {
  protected readonly sync = inject(SyncService);
  private readonly db = heapsightDb();
  protected readonly pilesPage = PILES_PAGE;
  protected readonly samplesPage = SAMPLES_PAGE;
  protected readonly pileLimit = signal(PILES_PAGE);
  protected readonly sampleLimit = signal(SAMPLES_PAGE);
  protected readonly overview = signal<Overview | null>(null);
  private warmTimer: ReturnType<typeof setTimeout> | undefined;
  /** True once the first read of the device database has been drawn. */
  readonly isLoaded = computed(() => this.overview() !== null);

  constructor() {
    effect((onCleanup) => {
      const [pileLimit, sampleLimit] = [this.pileLimit(), this.sampleLimit()];
      const subscription = liveQuery(() => this.read(pileLimit, sampleLimit)).subscribe({
        next: (overview) => this.overview.set(overview),
        error: (error: unknown) => console.error('capture home: the device database could not be read', error),
      });
      onCleanup(() => subscription.unsubscribe());
    });
    // While the crew reads the list, load the three forms (their code, the map and the record
    // checks), so a tap on a slow phone only has to draw the form. It waits until the first screen
    // and the start-up sync have had the phone to themselves for a few seconds, then uses idle time,
    // one form at a time.
    afterNextRender(() => {
      const forms = [() => import('../sample-form/sample-form'), () => import('../pan-test-form/pan-test-form'), () => import('../pile-form/pile-form')];
      const whenIdle = (next: () => void) => ('requestIdleCallback' in window ? requestIdleCallback(next, { timeout: 2000 }) : setTimeout(next, 200));
      const warmNext = () => {
        const form = forms.shift();
        if (form) whenIdle(() => void form().then(warmNext, () => undefined));
      };
      this.warmTimer = setTimeout(warmNext, WARM_FORMS_AFTER_MS);
    });
    inject(DestroyRef).onDestroy(() => clearTimeout(this.warmTimer));
  }

  private async read(pileLimit: number, sampleLimit: number): Promise<Overview> {
    const [pileCount, sampleCount, panTestCount, piles, samples] = await Promise.all([
      countLive(this.db.piles), countLive(this.db.samples), countLive(this.db.panTests),
      pilesByCode(this.db, { limit: pileLimit }), latestSamples(this.db, sampleLimit),
    ]);
    const photos = await firstPhotoOf(this.db, [...piles.map((pile) => pile.id), ...samples.map((sample) => sample.id)]);
    return { pileCount, sampleCount, panTestCount, piles, samples, photos };
  }
}
