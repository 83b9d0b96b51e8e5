import { Component, ElementRef, effect, input, output, viewChild, type AfterViewInit, type OnDestroy } from '@angular/core';
import { TranslocoPipe } from '@jsverse/transloco';
import * as L from 'leaflet';

/** A plain background map (no tiles in the field) where a tap adds a corner of the footprint. */
@Component({
  selector: 'hs-footprint-map',
  imports: [TranslocoPipe],
  template: `<div #map class="map" role="application" [attr.aria-label]="'captureParts.footprintMap' | transloco"></div>`,
  styles: `.map { height: 260px; border-radius: 12px; background: var(--mat-sys-surface-container-high); }`,
})
export class FootprintMap implements AfterViewInit, OnDestroy {
  readonly center = input<[number, number]>([-4.0512, 33.4518]);
  /** The corners so far, lon/lat; the ring follows them (taps, walking, a restored draft). */
  readonly corners = input<readonly [number, number][]>([]);
  readonly cornerAdded = output<[number, number]>();
  private readonly host = viewChild.required<ElementRef<HTMLDivElement>>('map');
  private map: L.Map | null = null;
  private ring: L.Polygon | null = null;

  constructor() {
    effect(() => this.redraw(this.corners()));
  }

  ngAfterViewInit(): void {
    L.Icon.Default.imagePath = 'leaflet/';
    this.map = L.map(this.host().nativeElement, { zoomControl: true }).setView(this.center(), 18);
    this.ring = L.polygon([], { color: '#b35c00' }).addTo(this.map);
    this.redraw(this.corners());
    this.map.on('click', (event: L.LeafletMouseEvent) => this.cornerAdded.emit([event.latlng.lng, event.latlng.lat]));
  }

  /** Redraws the ring from lon/lat corners. */
  redraw(corners: readonly [number, number][]): void {
    this.ring?.setLatLngs(corners.map(([lon, lat]) => L.latLng(lat, lon)));
  }

  ngOnDestroy(): void {
    this.map?.remove();
  }
}
