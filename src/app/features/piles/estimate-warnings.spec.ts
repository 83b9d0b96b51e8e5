import { TestBed } from '@angular/core/testing';
import { TranslocoService } from '@jsverse/transloco';
import { dryTonnes, estimatePile, flatToppedVolume, measureFootprint, surveyedVolume, type EngineWarning } from '../../../../shared/engine';
import { localPlane } from '../../../../shared/engine/geodesy';
import { hasWordsFor, warningText } from './estimate-warnings';

/** Places and polygons in metres east/north of a fixed origin, as the engine's own volume tests do. */
function localPlaneForTests() {
  const plane = localPlane({ lon: 30.05, lat: -1.95 });
  const lonLat = (x: number, y: number) => plane.toLonLat({ x, y });
  return {
    at: (x: number, y: number, heightM: number) => ({ ...lonLat(x, y), heightM }),
    polygon: (corners: readonly (readonly [number, number])[]) => {
      const ring = corners.map(([x, y]) => [lonLat(x, y).lon, lonLat(x, y).lat]);
      return { type: 'Polygon' as const, coordinates: [[...ring, ring[0]]] };
    },
  };
}

/** Every warning the engine gives about a pile estimate, made by the engine itself (not copied text). */
function engineWarnings(): EngineWarning[] {
  const plane = localPlaneForTests();
  const square = (side: number) => plane.polygon([[-side / 2, -side / 2], [side / 2, -side / 2], [side / 2, side / 2], [-side / 2, side / 2]]);
  const sample = (index: number, panGpt: number) => ({ sampleId: `s${index}`, sampleType: 'routine' as const, assayGpt: null, panGpt });
  const pile = { material: 'sluice-tailings' as const, shapeModel: 'sacks' as const, sackCount: 10, sackMassKg: 50 };
  const warnings: EngineWarning[] = [];
  const add = (result: { ok: boolean; value?: { warnings: readonly EngineWarning[] } }) => warnings.push(...(result.ok ? result.value!.warnings : []));
  add(estimatePile(pile, []));
  add(estimatePile(pile, [sample(1, 2)]));
  add(estimatePile(pile, [sample(1, 0), sample(2, 1), sample(3, 2)]));
  add(dryTonnes({ volumeM3: 10, bulkDensityTPerM3: 2.9, moisturePct: 0, material: 'mill-discharge' }));
  add(flatToppedVolume({ footprint: square(10), heightM: 8, angleOfReposeDeg: 40 }));
  add(surveyedVolume({ footprint: square(12), spotHeights: [plane.at(0, 0, 3), plane.at(0, 0, 3), plane.at(50, 50, 9)] }));
  const open = square(20);
  add(measureFootprint({ type: 'Polygon', coordinates: [open.coordinates[0].slice(0, -1)] }));
  // A surveyed surface that misses the toe is hard to build by hand; this is the sentence as volume.ts writes it.
  warnings.push({ code: 'surface-misses-toe', message: 'The surveyed surface covers 281.4 m² of a 300.0 m² footprint; add points along concave parts of the toe.' });
  return warnings;
}

describe('estimate warnings in the reader\'s language', () => {
  const translate = () => {
    const transloco = TestBed.inject(TranslocoService);
    return (key: string, params?: Record<string, unknown>) => transloco.translate(key, params);
  };

  it('has words for every warning the engine gives about an estimate, figures included', () => {
    const warnings = engineWarnings();
    expect(new Set(warnings.map((warning) => warning.code))).toEqual(new Set([
      'no-samples', 'single-sample', 'uncalibrated-pan', 'zero-grade', 'few-samples', 'density-implausible', 'crest-vanishes',
      'spot-outside-footprint', 'spot-repeated', 'surface-misses-toe', 'ring-closed',
    ]));
    expect(warnings.filter((warning) => !hasWordsFor(warning)).map((warning) => warning.message)).toEqual([]);
  });

  it('says in English what the engine says, naming the material as the app does', () => {
    for (const warning of engineWarnings()) {
      expect(warningText(warning, translate(), 'en')).toBe(warning.message.replace('for mill-discharge;', 'for Mill discharge;'));
    }
  });

  it('writes the figures again in French and names the material in French', () => {
    TestBed.inject(TranslocoService).setActiveLang('fr');
    const density = engineWarnings().find((warning) => warning.code === 'density-implausible')!;
    const french = warningText(density, translate(), 'fr');
    expect(density.message).toContain('2.90 t/m³');
    expect(french).toMatch(/^Une densité sèche de 2,90 t\/m³ sort des \d(,\d+)?–\d(,\d+)? t\/m³ habituels pour Rejets de broyeur\u00a0; vérifiez la mesure\.$/);
  });

  it('shows a warning it has no words for as the engine wrote it', () => {
    TestBed.inject(TranslocoService).setActiveLang('sw');
    expect(warningText({ code: 'something-new', message: 'A new engine warning.' }, translate(), 'sw')).toBe('A new engine warning.');
    expect(warningText({ code: 'few-samples', message: 'Reworded by a newer engine.' }, translate(), 'sw')).toBe('Reworded by a newer engine.');
    expect(warningText({ code: 'few-samples', message: 'Only 3 grades: the confidence interval is likely too narrow.' }, translate(), 'sw')).toBe('Viwango 3 tu: kipindi cha uhakika huenda ni chembamba mno.');
  });
});
