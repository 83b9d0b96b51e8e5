import { formatNumber } from '@angular/common';
import { Component, ElementRef, ViewEncapsulation, computed, effect, inject, signal, untracked, viewChild, type AfterViewInit, type OnDestroy } from '@angular/core';
import { TranslocoPipe, TranslocoService } from '@jsverse/transloco';
import { ActivatedRoute, RouterLink } from '@angular/router';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatIconModule } from '@angular/material/icon';
import * as L from 'leaflet';
import { idwGrid, seededRandom, type GridSpec } from '../../../../../../shared/engine';
import { AuthSession } from '../../../../core/auth/auth-session';
import { AppLanguage } from '../../../../i18n/app-language';
import { LOCALE_FORMAT_PIPES } from '../../../../i18n/locale-format.pipes';
import { rampCss } from '../../../../shared/ui/colour-ramp/colour-ramp';
import { GradeLegend } from '../../../../shared/ui/grade-legend/grade-legend';
import { openingSite, rememberSiteId, rememberedSiteId } from '../../../../core/site-choice/remembered-site';
import { addCoordinateGrid, addNorthArrow, SAMPLE_SYMBOLS, sampleIcon } from '../../components/map-decorations';
import { SiteImageForm } from '../../components/site-image-form/site-image-form';
import { classOfNetValue, formatMoney, netValueClassLabel, netValueClasses } from '../../net-value-classes';
import { HeatmapClient, type HeatmapPoints } from '../../heatmap-client';
import { paintGrid, pixelsToPng } from '../../heatmap-paint';
import { HEATMAP_GRID_SIDE } from '../../heatmap-protocol';
import { SiteMapStore, type MapImage, type MapPile, type MapSample, type MapShortlistRow, type UploadCorners } from '../../site-map.store';

/** Fill of piles with no grade or no rank: the hatch pattern defined in the page's template, never a colour alone. */
const HATCH_FILL = 'url(#hs-hatch)';
/** Roles that may read the shortlist (the server's `shortlist:read`), and so see net values. */
const NET_VALUE_READERS = ['geologist', 'manager', 'admin'];

/** Where the map opens when a site has nothing on it yet (the demo camp). */
const FALLBACK_CENTRE: L.LatLngTuple = [-4.0512, 33.4518];
// Padding around the samples' box, as a fraction of its size, so edge samples are not cut off.
const GRID_PADDING = 0.05;

/** A message of the page: our own words by key, or words that came from elsewhere (the engine) as they are. */
type PageProblem = { readonly key: string; readonly text?: undefined } | { readonly key?: undefined; readonly text: string };

/** What the heat map last drew. */
interface HeatmapState {
  readonly minValue: number;
  readonly maxValue: number;
  readonly sampleCount: number;
  readonly cellWidthM: number;
  readonly drawnMs: number;
  readonly where: 'worker' | 'main thread';
}

/** `Site map`: piles as footprints shaded by grade or net value, samples by type, the grade heat map, and (admins) the site picture. */
@Component({
  selector: 'hs-site-map-page',
  imports: [TranslocoPipe, LOCALE_FORMAT_PIPES, RouterLink, MatButtonModule, MatButtonToggleModule, MatIconModule, GradeLegend, SiteImageForm],
  templateUrl: './site-map-page.html',
  styleUrl: './site-map-page.scss',
  // Leaflet builds its own DOM, which emulated encapsulation would not reach.
  encapsulation: ViewEncapsulation.None,
})
export default class SiteMapPage implements AfterViewInit, OnDestroy {
  protected readonly store = inject(SiteMapStore);
  private readonly session = inject(AuthSession);
  private readonly route = inject(ActivatedRoute);
  private readonly transloco = inject(TranslocoService);
  protected readonly language = inject(AppLanguage);
  private readonly mapElement = viewChild.required<ElementRef<HTMLDivElement>>('map');

  protected readonly gridSide = HEATMAP_GRID_SIDE;
  protected readonly symbols = Object.entries(SAMPLE_SYMBOLS).map(([type, symbol]) => ({ type, ...symbol }));
  protected readonly sites = computed(() => this.session.user()?.sites ?? []);
  protected readonly siteId = signal<string | null>(null);
  protected readonly shading = signal<'grade' | 'net-value'>('grade');
  protected readonly isHeatmapShown = signal(false);
  protected readonly isHeatmapBusy = signal(false);
  protected readonly heatmap = signal<HeatmapState | null>(null);
  protected readonly heatmapProblem = signal<PageProblem | null>(null);
  protected readonly selectedPile = signal<MapPile | null>(null);
  /** Why the net values could not be had (the server's words), or null. */
  protected readonly shadingProblem = signal<string | null>(null);
  protected readonly isShortlistLoading = signal(false);
  protected readonly canSeeNetValue = computed(() => NET_VALUE_READERS.includes(this.session.role() ?? ''));
  protected readonly isAdmin = computed(() => this.session.role() === 'admin');
  /** The box the map shows now, offered to the site picture form as corners. */
  protected readonly viewBox = signal<UploadCorners | null>(null);
  /** The shortlist's line per pile (net value and rank from the engine), when it is loaded for this site. */
  protected readonly shortlistRows = computed(() => {
    const shortlist = this.store.shortlist();
    return shortlist && shortlist.site.id === this.siteId() ? new Map(shortlist.rows.map((row) => [row.pileId, row])) : null;
  });
  protected readonly currency = computed(() => this.store.shortlist()?.parameters.currency ?? '');
  protected readonly valueClasses = computed(() => {
    const rows = [...(this.shortlistRows()?.values() ?? [])];
    const currency = this.currency();
    const locale = this.language.locale();
    const classes = netValueClasses(rows.flatMap((row) => (row.rank !== null && row.netValue !== null ? [row.netValue] : [])));
    return classes.map((entry) => ({ ...entry, label: netValueClassLabel(entry, currency, this.say, locale) }));
  });
  protected readonly unrankedCount = computed(() => [...(this.shortlistRows()?.values() ?? [])].filter((row) => row.rank === null || row.netValue === null).length);
  protected readonly selectedValue = computed<MapShortlistRow | null>(() => {
    const row = this.selectedPile();
    return row ? this.shortlistRows()?.get(row.pile.id) ?? null : null;
  });
  protected readonly money = formatMoney;
  /** Bench only: `?synthetic=N` maps N generated samples instead of a site's, `&mainThread=1` computes on the page. */
  private readonly syntheticCount = Number(this.route.snapshot.queryParamMap.get('synthetic') ?? 0);
  private readonly isMainThreadBaseline = this.route.snapshot.queryParamMap.get('mainThread') === '1';

  protected readonly pileRange = computed(() => {
    const grades = (this.store.review()?.piles ?? []).map((row) => row.estimate?.grade?.meanGpt).filter((grade): grade is number => grade !== undefined);
    return grades.length > 0 ? { min: Math.min(...grades), max: Math.max(...grades) } : null;
  });

  private map: L.Map | null = null;
  private northArrow: L.Control | null = null;
  /** Counts site openings, so a slow answer for a site no longer wanted never replaces the one the user picked. */
  private siteOpening = 0;
  // Piles draw as SVG (the rest of the map on canvas) so a hatch pattern can fill piles with no grade or rank.
  private readonly pileRenderer = L.svg({ padding: 0.2 });
  private readonly layers = { piles: L.layerGroup(), samples: L.layerGroup(), image: null as L.ImageOverlay | null, heatmap: null as L.ImageOverlay | null };
  private heatmapClient: HeatmapClient | null = null;
  private removeGrid: (() => void) | null = null;
  private objectUrls: string[] = [];

  /** Translates a key (the words Leaflet draws are made in TypeScript). */
  private readonly say = (key: string, params?: Record<string, unknown>): string => this.transloco.translate(key, params);

  constructor() {
    // The words drawn on the map (pile labels, sample tooltips and letters, the north arrow) are
    // Leaflet's DOM, not the template's: draw them again when the language changes.
    effect(() => {
      this.language.active();
      untracked(() => this.redrawWords());
    });
  }

  private redrawWords(): void {
    const map = this.map;
    if (!map) {
      return;
    }
    this.northArrow?.remove();
    this.northArrow = addNorthArrow(map, { label: this.say('siteMap.northArrow.label'), letter: this.say('siteMap.northArrow.letter') });
    this.drawPiles();
    this.drawSamples();
  }

  async ngAfterViewInit(): Promise<void> {
    L.Icon.Default.imagePath = 'leaflet/';
    const map = L.map(this.mapElement().nativeElement, { zoomControl: true, preferCanvas: true, attributionControl: false }).setView(FALLBACK_CENTRE, 17);
    this.map = map;
    L.control.scale({ metric: true, imperial: false, position: 'bottomright' }).addTo(map);
    this.northArrow = addNorthArrow(map, { label: this.say('siteMap.northArrow.label'), letter: this.say('siteMap.northArrow.letter') });
    this.removeGrid = addCoordinateGrid(map);
    this.layers.piles.addTo(map);
    this.layers.samples.addTo(map);
    const tileUrl = await this.store.tileUrl();
    if (tileUrl) {
      L.tileLayer(tileUrl, { maxZoom: 22 }).addTo(map);
    }
    const updateViewBox = () => {
      const box = map.getBounds();
      this.viewBox.set({ west: box.getWest(), south: box.getSouth(), east: box.getEast(), north: box.getNorth() });
    };
    map.on('moveend', updateViewBox);
    updateViewBox();
    if (this.syntheticCount > 0) {
      return;
    }
    const opening = ++this.siteOpening;
    const asked = this.route.snapshot.queryParamMap.get('site');
    const siteIds = this.sites().map((site) => site.id);
    const found = await openingSite(
      asked && siteIds.includes(asked) ? [asked] : siteIds,
      asked ? null : rememberedSiteId('site-map'),
      (siteId) => this.store.fetchReview(siteId),
      (review) => review.piles.length > 0 || review.samples.length > 0,
    );
    if (!found || opening !== this.siteOpening) {
      return;
    }
    if (found.data) {
      this.siteId.set(found.siteId);
      this.store.show(found.data);
      await this.redrawForSite();
    } else {
      await this.openSite(found.siteId);
    }
  }

  ngOnDestroy(): void {
    this.removeGrid?.();
    this.map?.remove();
    this.heatmapClient?.terminate();
    this.objectUrls.forEach((url) => URL.revokeObjectURL(url));
  }

  /** The site picker: opens the site and remembers it on this device. */
  protected async chooseSite(siteId: string): Promise<void> {
    rememberSiteId('site-map', siteId);
    await this.openSite(siteId);
  }

  private async openSite(siteId: string): Promise<void> {
    const opening = ++this.siteOpening;
    this.siteId.set(siteId);
    await this.store.load(siteId);
    if (opening === this.siteOpening) {
      await this.redrawForSite();
    }
  }

  private async redrawForSite(): Promise<void> {
    this.selectedPile.set(null);
    this.shadingProblem.set(null);
    this.hideHeatmap();
    if (this.shading() === 'net-value') {
      await this.ensureShortlist();
    }
    await this.drawSite();
  }

  /** Grade or net value: net value comes from the site's shortlist, fetched once per site. */
  protected async setShading(shading: 'grade' | 'net-value'): Promise<void> {
    this.shading.set(shading);
    this.shadingProblem.set(null);
    if (shading === 'net-value') {
      await this.ensureShortlist();
    }
    this.drawPiles();
  }

  private async ensureShortlist(): Promise<void> {
    const siteId = this.siteId();
    if (!siteId || this.shortlistRows()) {
      return;
    }
    this.isShortlistLoading.set(true);
    // The store answers the server's reason; the page says it in a sentence of the reader's language.
    this.shadingProblem.set(await this.store.loadShortlist(siteId));
    this.isShortlistLoading.set(false);
  }

  /** The admin's new picture (or corners): into the review shown and onto the map at once. */
  protected async showUploadedImage(image: MapImage): Promise<void> {
    this.store.replaceImage(image);
    await this.drawImage();
    this.map?.fitBounds([[image.south, image.west], [image.north, image.east]], { maxZoom: 19 });
  }

  protected async toggleHeatmap(): Promise<void> {
    if (this.isHeatmapShown()) {
      this.hideHeatmap();
      return;
    }
    await this.showHeatmap();
  }

  /** From "show heat map" to the overlay drawn: points to the worker, PNG back, image laid on the map. */
  protected async showHeatmap(): Promise<void> {
    const map = this.map;
    const points = this.syntheticCount > 0 ? syntheticPoints(this.syntheticCount) : this.gradePoints();
    if (!map || !points) {
      this.heatmapProblem.set({ key: 'siteMap.heatmap.noGrades' });
      return;
    }
    const started = performance.now();
    this.isHeatmapBusy.set(true);
    this.heatmapProblem.set(null);
    const count = points.lons.length;
    const grid = gridAround(points);
    const answer = this.isMainThreadBaseline ? await computeOnPage(points, grid) : await this.worker().compute(points, grid);
    if (!answer.ok) {
      this.isHeatmapBusy.set(false);
      this.heatmapProblem.set({ text: answer.errors.join(' ') });
      return;
    }
    const url = URL.createObjectURL(answer.png);
    this.objectUrls.push(url);
    this.layers.heatmap?.remove();
    const overlay = L.imageOverlay(url, [[grid.south, grid.west], [grid.north, grid.east]], { opacity: 1, className: 'hs-heatmap', interactive: false });
    overlay.once('load', () => {
      const drawnMs = performance.now() - started;
      this.isHeatmapBusy.set(false);
      this.isHeatmapShown.set(true);
      this.heatmap.set({ minValue: answer.minValue, maxValue: answer.maxValue, sampleCount: count, cellWidthM: answer.cellWidthM, drawnMs, where: this.isMainThreadBaseline ? 'main thread' : 'worker' });
      performance.measure('heatmap-drawn', { start: started, end: started + drawnMs });
    });
    overlay.addTo(map);
    overlay.bringToFront();
    this.layers.piles.eachLayer((layer) => (layer as L.Path).bringToFront?.());
    if (this.syntheticCount > 0) {
      map.fitBounds([[grid.south, grid.west], [grid.north, grid.east]]);
    }
  }

  private hideHeatmap(): void {
    this.layers.heatmap?.remove();
    this.layers.heatmap = null;
    this.isHeatmapShown.set(false);
    this.heatmap.set(null);
  }

  private worker(): HeatmapClient {
    this.heatmapClient ??= new HeatmapClient();
    return this.heatmapClient;
  }

  /** Routine and duplicate samples with a location and a grade (blanks and standards are QA/QC, not the pile). */
  private gradePoints(): HeatmapPoints | null {
    const graded = (this.store.review()?.samples ?? []).filter(
      (sample): sample is MapSample & { gradeGpt: number; location: NonNullable<MapSample['location']> } =>
        sample.gradeGpt !== null && sample.location !== null && (sample.sampleType === 'routine' || sample.sampleType === 'duplicate'),
    );
    if (graded.length === 0) {
      return null;
    }
    return {
      lons: Float64Array.from(graded, (sample) => sample.location.coordinates[0]),
      lats: Float64Array.from(graded, (sample) => sample.location.coordinates[1]),
      values: Float64Array.from(graded, (sample) => sample.gradeGpt),
    };
  }

  private async drawSite(): Promise<void> {
    const map = this.map;
    const review = this.store.review();
    if (!map || !review) {
      return;
    }
    this.drawPiles();
    this.drawSamples();
    const extent = L.latLngBounds([]);
    this.layers.piles.eachLayer((layer) => extent.extend((layer as L.GeoJSON).getBounds()));
    this.layers.samples.eachLayer((layer) => extent.extend((layer as L.Marker).getLatLng()));
    if (extent.isValid()) {
      map.fitBounds(extent.pad(0.15), { maxZoom: 19 });
    }
    await this.drawImage();
  }

  /** Sample markers by type (shape and letter) with a tooltip of code, type and grade, in the reader's language. */
  private drawSamples(): void {
    const review = this.store.review();
    this.layers.samples.clearLayers();
    if (!review) {
      return;
    }
    const locale = this.language.locale();
    for (const sample of review.samples) {
      if (!sample.location) continue;
      const [lon, lat] = sample.location.coordinates;
      const symbol = SAMPLE_SYMBOLS[sample.sampleType];
      const type = symbol ? this.say(symbol.labelKey) : sample.sampleType;
      const title = sample.gradeGpt === null
        ? this.say('siteMap.tooltip.sample', { code: sample.code, type })
        : this.say('siteMap.tooltip.sampleGraded', { code: sample.code, type, gpt: formatNumber(sample.gradeGpt, locale, '1.2-2') });
      const marker = sample.sampleType === 'routine'
        ? L.circleMarker([lat, lon], { radius: 4, color: '#1d2430', weight: 1, fillColor: '#ffffff', fillOpacity: 1 })
        : L.marker([lat, lon], { icon: sampleIcon(sample.sampleType, this.say((symbol ?? SAMPLE_SYMBOLS['routine']).letterKey)), keyboard: false });
      marker.bindTooltip(title);
      this.layers.samples.addLayer(marker);
    }
  }

  /** Pile footprints, filled by the shading chosen; the label always says the figure in words. */
  private drawPiles(): void {
    const review = this.store.review();
    this.layers.piles.clearLayers();
    if (!review) {
      return;
    }
    const isNetValue = this.shading() === 'net-value';
    const values = this.shortlistRows();
    const classes = this.valueClasses();
    const currency = this.currency();
    const range = this.pileRange();
    const locale = this.language.locale();
    for (const row of review.piles) {
      if (!row.pile.footprint) continue;
      let fill: string | null;
      let label: string;
      if (isNetValue) {
        const line = values?.get(row.pile.id);
        const hasRank = line !== undefined && line.rank !== null && line.netValue !== null;
        fill = hasRank ? classOfNetValue(line.netValue as number, classes)?.fill ?? null : null;
        label = !values
          ? row.pile.code
          : hasRank
            ? this.say('siteMap.labels.ranked', { code: row.pile.code, rank: line.rank, value: formatMoney(line.netValue as number, currency, locale) })
            : this.say('siteMap.labels.notRanked', { code: row.pile.code });
      } else {
        const meanGpt = row.estimate?.grade?.meanGpt;
        const position = meanGpt === undefined || !range ? null : range.max > range.min ? (meanGpt - range.min) / (range.max - range.min) : 0.5;
        fill = position === null ? null : rampCss(position);
        label = meanGpt === undefined
          ? this.say('siteMap.labels.noGrade', { code: row.pile.code })
          : this.say('siteMap.labels.grade', { code: row.pile.code, gpt: formatNumber(meanGpt, locale, '1.2-2') });
      }
      const polygon = L.geoJSON(row.pile.footprint, {
        renderer: this.pileRenderer,
        style: { color: '#1d2430', weight: 3, fillColor: fill ?? HATCH_FILL, fillOpacity: fill === null ? 0.9 : 0.85, dashArray: fill === null ? '8 5' : undefined },
      } as L.GeoJSONOptions);
      polygon.bindTooltip(label, { permanent: true, direction: 'center', className: 'hs-pile-label' });
      polygon.on('click', () => this.selectedPile.set(row));
      this.layers.piles.addLayer(polygon);
    }
  }

  /** The site picture under everything else, from the review's image record. */
  private async drawImage(): Promise<void> {
    const map = this.map;
    const image = this.store.review()?.image ?? null;
    this.layers.image?.remove();
    this.layers.image = null;
    if (!map || !image) {
      return;
    }
    const url = await this.store.imageObjectUrl(image);
    if (url) {
      this.objectUrls.push(url);
      this.layers.image = L.imageOverlay(url, [[image.south, image.west], [image.north, image.east]], { interactive: false, className: 'hs-site-image' }).addTo(map);
      this.layers.image.bringToBack();
    }
  }
}

/** The grid box around the points, padded, at 200 × 200 cells. */
function gridAround(points: HeatmapPoints): GridSpec {
  let west = Infinity, east = -Infinity, south = Infinity, north = -Infinity;
  for (let index = 0; index < points.lons.length; index += 1) {
    west = Math.min(west, points.lons[index]);
    east = Math.max(east, points.lons[index]);
    south = Math.min(south, points.lats[index]);
    north = Math.max(north, points.lats[index]);
  }
  // A single sample or a line of them still needs a box: at least about 10 m each way.
  const padLon = Math.max((east - west) * GRID_PADDING, 1e-4);
  const padLat = Math.max((north - south) * GRID_PADDING, 1e-4);
  return { west: west - padLon, east: east + padLon, south: south - padLat, north: north + padLat, columns: HEATMAP_GRID_SIDE, rows: HEATMAP_GRID_SIDE };
}

/** The bench's baseline: the same engine call and painting, on the page's own thread. */
async function computeOnPage(points: HeatmapPoints, grid: GridSpec) {
  const samples = Array.from(points.lons, (lon, index) => ({ lon, lat: points.lats[index], value: points.values[index] }));
  const result = idwGrid(samples, grid);
  if (!result.ok) {
    return { ok: false as const, errors: result.errors.map((error) => error.message) };
  }
  const { values, hasValue, minValue, maxValue, columns, rows, cellWidthM } = result.value;
  return { ok: true as const, png: await pixelsToPng(paintGrid(values, hasValue, minValue, maxValue), columns, rows), minValue, maxValue, cellWidthM };
}

/** Bench only: N samples scattered over about a kilometre around the demo camp, lognormal-ish grades, fixed seed. */
function syntheticPoints(count: number): HeatmapPoints {
  const random = seededRandom(20260301);
  const points = { lons: new Float64Array(count), lats: new Float64Array(count), values: new Float64Array(count) };
  for (let index = 0; index < count; index += 1) {
    points.lons[index] = FALLBACK_CENTRE[1] + (random() - 0.5) * 0.01;
    points.lats[index] = FALLBACK_CENTRE[0] + (random() - 0.5) * 0.01;
    points.values[index] = Math.exp((random() + random() + random() - 1.5) * 1.2);
  }
  return points;
}
