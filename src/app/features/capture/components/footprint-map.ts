import { Component, ElementRef, type OnDestroy, type AfterViewInit, output, viewChild, input } from '@angular/core';
import * as L from 'leaflet';

/** A plain background map (no tiles in the field) where a tap adds a corner of the footprint. */
@Component({
  selector: 'hs-footprint-map',
  template: `<div #map class="map" aria-label="Tap the corners of the pile toe"></div>`,
  styles: `.map { height: 260px; border-radius: 12px; background: var(--mat-sys-surface-container-high); }`,
})
export class FootprintMap implements AfterViewInit, OnDestroy {
  readonly center = input<[number, number]>([-4.0512, 33.4518]);
  readonly corners = input<readonly [number, number][]>([]);
  readonly cornerAdded = output<[number, number]>();
  private readonly host = viewChild.required<ElementRef<HTMLDivElement>>('map');
  private map: L.Map | null = null;
  private ring: L.Polygon | null = null;

  ngAfterViewInit(): void {
    L.Icon.Default.imagePath = 'leaflet/';
    this.map = L.map(this.host().nativeElement, { zoomControl: true }).setView(this.center(), 18);
    this.ring = L.polygon([], { color: '#b35c00' }).addTo(this.map);
    this.map.on('click', (event: L.LeafletMouseEvent) => {
      const corner: [number, number] = [event.latlng.lng, event.latlng.lat];
      this.cornerAdded.emit(corner);
      this.ring?.addLatLng(event.latlng);
    });
  }

  /** Redraws the ring from lon/lat corners (e.g. after walking). */
  redraw(corners: readonly [number, number][]): void {
    this.ring?.setLatLngs(corners.map(([lon, lat]) => L.latLng(lat, lon)));
  }

  ngOnDestroy(): void {
    this.map?.remove();
  }
}
