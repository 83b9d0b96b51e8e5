import * as L from 'leaflet';

/** A "nice" step (1, 2 or 5 × 10ⁿ degrees) that draws about `lines` grid lines across `span`. */
export function niceStepDeg(span: number, lines = 5): number {
  const rough = span / lines;
  const power = 10 ** Math.floor(Math.log10(rough));
  const scaled = rough / power;
  return (scaled < 1.5 ? 1 : scaled < 3.5 ? 2 : scaled < 7.5 ? 5 : 10) * power;
}

/**
 * A coordinate grid in degrees for the plain background (no tiles in the field): lines and
 * labels redrawn for the view after every move.
 */
export function addCoordinateGrid(map: L.Map): () => void {
  const layer = L.layerGroup().addTo(map);
  const draw = () => {
    layer.clearLayers();
    const bounds = map.getBounds();
    const step = niceStepDeg(Math.max(bounds.getEast() - bounds.getWest(), bounds.getNorth() - bounds.getSouth()));
    const decimals = Math.max(0, -Math.floor(Math.log10(step)));
    const style: L.PolylineOptions = { color: '#6b6f76', weight: 1, opacity: 0.5, interactive: false, dashArray: '4 4' };
    for (let lon = Math.ceil(bounds.getWest() / step) * step; lon <= bounds.getEast(); lon += step) {
      layer.addLayer(L.polyline([[bounds.getSouth(), lon], [bounds.getNorth(), lon]], style));
      layer.addLayer(L.marker([bounds.getSouth(), lon], { interactive: false, keyboard: false, icon: L.divIcon({ className: 'hs-grid-label hs-grid-label-lon', html: `${lon.toFixed(decimals)}°`, iconSize: [0, 0] }) }));
    }
    for (let lat = Math.ceil(bounds.getSouth() / step) * step; lat <= bounds.getNorth(); lat += step) {
      layer.addLayer(L.polyline([[lat, bounds.getWest()], [lat, bounds.getEast()]], style));
      layer.addLayer(L.marker([lat, bounds.getWest()], { interactive: false, keyboard: false, icon: L.divIcon({ className: 'hs-grid-label hs-grid-label-lat', html: `${lat.toFixed(decimals)}°`, iconSize: [0, 0] }) }));
    }
  };
  map.on('moveend zoomend resize', draw);
  draw();
  return () => {
    map.off('moveend zoomend resize', draw);
    layer.remove();
  };
}

/** The words of the north arrow in the reader's language: its spoken label and the letter drawn under it. */
export interface NorthArrowWords {
  readonly label: string;
  readonly letter: string;
}

/** Text as HTML, for the few words drawn into Leaflet's own markup. */
function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (character) => `&#${character.charCodeAt(0)};`);
}

/** A north arrow (the map is always north-up); remove the control it answers and add another to change its words. */
export function addNorthArrow(map: L.Map, words: NorthArrowWords): L.Control {
  const NorthArrow = L.Control.extend({
    onAdd: () => {
      const element = L.DomUtil.create('div', 'hs-north-arrow');
      element.setAttribute('role', 'img');
      element.setAttribute('aria-label', words.label);
      element.innerHTML =
        '<svg viewBox="0 0 32 44" width="32" height="44" aria-hidden="true"><path d="M16 2 L27 30 L16 24 L5 30 Z" fill="#1d2430"/><path d="M16 2 L16 24 L5 30 Z" fill="#ffffff" stroke="#1d2430" stroke-width="1.5"/>' +
        `<text x="16" y="42" text-anchor="middle" font-size="12" font-weight="700" fill="#1d2430">${escapeHtml(words.letter)}</text></svg>`;
      return element;
    },
  });
  return new NorthArrow({ position: 'topright' }).addTo(map);
}

/**
 * The marker shape of each sample type: shape and letter both differ, so colour is never the only
 * cue. The letter is the first of the type's name in the reader's language (a translation key), the
 * name is the shared sample-type term.
 */
export const SAMPLE_SYMBOLS: Record<string, { readonly shape: string; readonly letterKey: string; readonly labelKey: string }> = {
  routine: { shape: 'circle', letterKey: 'siteMap.symbols.routineLetter', labelKey: 'common.terms.sampleType.routine' },
  duplicate: { shape: 'diamond', letterKey: 'siteMap.symbols.duplicateLetter', labelKey: 'common.terms.sampleType.duplicate' },
  blank: { shape: 'square', letterKey: 'siteMap.symbols.blankLetter', labelKey: 'common.terms.sampleType.blank' },
  standard: { shape: 'triangle', letterKey: 'siteMap.symbols.standardLetter', labelKey: 'common.terms.sampleType.standard' },
};

/** A small marker icon for a QA/QC sample: its shape with its letter (already in the reader's language). */
export function sampleIcon(sampleType: string, letter: string): L.DivIcon {
  const symbol = SAMPLE_SYMBOLS[sampleType] ?? SAMPLE_SYMBOLS['routine'];
  return L.divIcon({ className: `hs-sample hs-sample-${symbol.shape}`, html: `<span>${escapeHtml(letter)}</span>`, iconSize: [18, 18] });
}
