import { Component, ElementRef, ViewEncapsulation, effect, input, viewChild, type OnDestroy } from '@angular/core';
import { TranslocoPipe } from '@jsverse/transloco';
import * as L from 'leaflet';
import type { PileData } from '../../../../../shared/sync/protocol';

/** A small north-up map of one pile's footprint and its sample points, on a plain background. */
@Component({
  selector: 'hs-footprint-preview',
  imports: [TranslocoPipe],
  template: `<div #map class="footprint-preview" role="img" [attr.aria-label]="'piles.footprintPreview.label' | transloco: { label: label() || ('piles.footprintPreview.thePile' | transloco) }"></div>`,
  styleUrl: './footprint-preview.scss',
  encapsulation: ViewEncapsulation.None,
})
export class FootprintPreview implements OnDestroy {
  readonly footprint = input<PileData['footprint']>(null);
  readonly points = input<readonly [number, number][]>([]);
  /** What the footprint is of (the pile's code); empty says "the pile" in the active language. */
  readonly label = input('');
  private readonly host = viewChild.required<ElementRef<HTMLDivElement>>('map');
  private map: L.Map | null = null;

  constructor() {
    effect(() => {
      const footprint = this.footprint();
      const points = this.points();
      this.map?.remove();
      this.map = L.map(this.host().nativeElement, { attributionControl: false, zoomControl: false, dragging: false, scrollWheelZoom: false });
      L.control.scale({ metric: true, imperial: false }).addTo(this.map);
      const extent = L.latLngBounds([]);
      if (footprint) {
        const shape = L.geoJSON(footprint, { style: { color: '#1d2430', weight: 2, fillColor: '#c9b98f', fillOpacity: 0.6 } }).addTo(this.map);
        extent.extend(shape.getBounds());
      }
      for (const [lon, lat] of points) {
        L.circleMarker([lat, lon], { radius: 4, color: '#1d2430', weight: 1, fillColor: '#ffffff', fillOpacity: 1 }).addTo(this.map);
        extent.extend([lat, lon]);
      }
      if (extent.isValid()) this.map.fitBounds(extent.pad(0.2), { maxZoom: 20 });
      else this.map.setView([0, 0], 2);
    });
  }

  ngOnDestroy(): void {
    this.map?.remove();
  }
}
