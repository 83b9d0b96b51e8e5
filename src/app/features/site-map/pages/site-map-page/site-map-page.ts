import { DecimalPipe } from '@angular/common';
import { Component, ElementRef, ViewEncapsulation, computed, inject, signal, viewChild, type AfterViewInit, type OnDestroy } from '@angular/core';
import { ActivatedRoute, RouterLink } from '@angular/router';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatIconModule } from '@angular/material/icon';
import * as L from 'leaflet';
import { idwGrid, seededRandom, type GridSpec } from '../../../../../../shared/engine';
import { PLANNING_ESTIMATE_STATEMENT } from '../../../../../../shared/safety/cautions';
import { AuthSession } from '../../../../core/auth/auth-session';
import { rampCss } from '../../../../shared/ui/colour-ramp/colour-ramp';
import { GradeLegend } from '../../../../shared/ui/grade-legend/grade-legend';
import { addCoordinateGrid, addNorthArrow, SAMPLE_SYMBOLS, sampleIcon } from '../../components/map-decorations';
import { HeatmapClient, type HeatmapPoints } from '../../heatmap-client';
import { paintGrid, pixelsToPng } from '../../heatmap-paint';
import { HEATMAP_GRID_SIDE } from '../../heatmap-protocol';
import { SiteMapStore, type MapPile, type MapSample } from '../../site-map.store';

/** Where the map opens when a site has nothing on it yet (the demo camp). */
const FALLBACK_CENTRE: L.LatLngTuple = [-4.0512, 33.4518];
// Padding around the samples' box, as a fraction of its size, so edge samples are not cut off.
const GRID_PADDING = 0.05;

/** What the heat map last drew. */
interface HeatmapState {
  readonly minValue: number;
  readonly maxValue: number;
  readonly sampleCount: number;
  readonly cellWidthM: number;
  readonly drawnMs: number;
  readonly where: 'worker' | 'main thread';
}

/** `Site map`: piles as footprints shaded by grade, samples by type, and the grade heat map. */
@Component({
  selector: 'hs-site-map-page',
  imports: [DecimalPipe, RouterLink, MatButtonModule, MatButtonToggleModule, MatIconModule, GradeLegend],
  templateUrl: './site-map-page.html',
  styleUrl: './site-map-page.scss',
  // Leaflet builds its own DOM, which emulated encapsulation would not reach.
  encapsulation: ViewEncapsulation.None,
})
export default class SiteMapPage implements AfterViewInit, OnDestroy {
  protected readonly store = inject(SiteMapStore);
  private readonly session = inject(AuthSession);
  private readonly route = inject(ActivatedRoute);
  private readonly mapElement = viewChild.required<ElementRef<HTMLDivElement>>('map');

  protected readonly statement = PLANNING_ESTIMATE_STATEMENT;
  protected readonly symbols = Object.entries(SAMPLE_SYMBOLS).map(([type, symbol]) => ({ type, ...symbol }));
  protected readonly sites = computed(() => this.session.user()?.sites ?? []);
  protected readonly siteId = signal<string | null>(null);
  protected readonly shading = signal<'grade' | 'net-value'>('grade');
  protected readonly isHeatmapShown = signal(false);
  protected readonly isHeatmapBusy = signal(false);
  protected readonly heatmap = signal<HeatmapState | null>(null);
  protected readonly heatmapProblem = signal<string | null>(null);
  protected readonly selectedPile = signal<MapPile | null>(null);
  /** Bench only: `?synthetic=N` maps N generated samples instead of a site's, `&mainThread=1` computes on the page. */
  private readonly syntheticCount = Number(this.route.snapshot.queryParamMap.get('synthetic') ?? 0);
  private readonly isMainThreadBaseline = this.route.snapshot.queryParamMap.get('mainThread') === '1';

  protected readonly pileRange = computed(() => {
    const grades = (this.store.review()?.piles ?? []).map((row) => row.estimate?.grade?.meanGpt).filter((grade): grade is number => grade !== undefined);
    return grades.length > 0 ? { min: Math.min(...grades), max: Math.max(...grades) } : null;
  });

  private map: L.Map | null = null;
  private readonly layers = { piles: L.layerGroup(), samples: L.layerGroup(), image: null as L.ImageOverlay | null, heatmap: null as L.ImageOverlay | null };
  private heatmapClient: HeatmapClient | null = null;
  private removeGrid: (() => void) | null = null;
  private objectUrls: string[] = [];

  async ngAfterViewInit(): Promise<void> {
    L.Icon.Default.imagePath = 'leaflet/';
    const map = L.map(this.mapElement().nativeElement, { zoomControl: true, preferCanvas: true, attributionControl: false }).setView(FALLBACK_CENTRE, 17);
    this.map = map;
    L.control.scale({ metric: true, imperial: false, position: 'bottomright' }).addTo(map);
    addNorthArrow(map);
    this.removeGrid = addCoordinateGrid(map);
    this.layers.piles.addTo(map);
    this.layers.samples.addTo(map);
    const tileUrl = await this.store.tileUrl();
    if (tileUrl) {
      L.tileLayer(tileUrl, { maxZoom: 22 }).addTo(map);
    }
    if (this.syntheticCount > 0) {
      return;
    }
    const first = this.route.snapshot.queryParamMap.get('site') ?? this.sites()[0]?.id ?? null;
    if (first) {
      await this.chooseSite(first);
    }
  }

  ngOnDestroy(): void {
    this.removeGrid?.();
    this.map?.remove();
    this.heatmapClient?.terminate();
    this.objectUrls.forEach((url) => URL.revokeObjectURL(url));
  }

  protected async chooseSite(siteId: string): Promise<void> {
    this.siteId.set(siteId);
    this.selectedPile.set(null);
    this.hideHeatmap();
    await this.store.load(siteId);
    this.drawSite();
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
      this.heatmapProblem.set('No sample has a grade yet: the heat map needs graded samples with a location.');
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
      this.heatmapProblem.set(answer.errors.join(' '));
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
    this.layers.piles.clearLayers();
    this.layers.samples.clearLayers();
    this.layers.image?.remove();
    const range = this.pileRange();
    for (const row of review.piles) {
      if (!row.pile.footprint) continue;
      const meanGpt = row.estimate?.grade?.meanGpt;
      const position = meanGpt === undefined || !range ? null : range.max > range.min ? (meanGpt - range.min) / (range.max - range.min) : 0.5;
      const polygon = L.geoJSON(row.pile.footprint, {
        style: { color: '#1d2430', weight: 2, fillColor: position === null ? '#ffffff' : rampCss(position), fillOpacity: position === null ? 0.2 : 0.85, dashArray: position === null ? '6 4' : undefined },
      });
      const label = meanGpt === undefined ? `${row.pile.code} · no grade yet` : `${row.pile.code} · ${meanGpt.toFixed(2)} g/t`;
      polygon.bindTooltip(label, { permanent: true, direction: 'center', className: 'hs-pile-label' });
      polygon.on('click', () => this.selectedPile.set(row));
      this.layers.piles.addLayer(polygon);
    }
    for (const sample of review.samples) {
      if (!sample.location) continue;
      const [lon, lat] = sample.location.coordinates;
      const title = `${sample.code} · ${SAMPLE_SYMBOLS[sample.sampleType]?.label ?? sample.sampleType}${sample.gradeGpt === null ? '' : ` · ${sample.gradeGpt.toFixed(2)} g/t`}`;
      const marker = sample.sampleType === 'routine'
        ? L.circleMarker([lat, lon], { radius: 4, color: '#1d2430', weight: 1, fillColor: '#ffffff', fillOpacity: 1 })
        : L.marker([lat, lon], { icon: sampleIcon(sample.sampleType), keyboard: false });
      marker.bindTooltip(title);
      this.layers.samples.addLayer(marker);
    }
    const extent = L.latLngBounds([]);
    this.layers.piles.eachLayer((layer) => extent.extend((layer as L.GeoJSON).getBounds()));
    this.layers.samples.eachLayer((layer) => extent.extend((layer as L.Marker).getLatLng()));
    if (extent.isValid()) {
      map.fitBounds(extent.pad(0.15), { maxZoom: 19 });
    }
    if (review.image) {
      const url = await this.store.imageObjectUrl(review.image);
      if (url) {
        this.objectUrls.push(url);
        this.layers.image = L.imageOverlay(url, [[review.image.south, review.image.west], [review.image.north, review.image.east]], { interactive: false }).addTo(map);
        this.layers.image.bringToBack();
      }
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
