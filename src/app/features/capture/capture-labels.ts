import type { PileData, SampleData } from '../../../../shared/sync/protocol';
import { COLOUR_SIZE_CLASSES } from '../../../../shared/sync/protocol';

/** Words a crew reads for each material (the records keep the API's values). */
export const MATERIAL_LABELS: Readonly<Record<PileData['material'], string>> = {
  'mill-discharge': 'Mill discharge',
  'sluice-tailings': 'Sluice tailings',
  'waste-rock': 'Waste rock',
  'pit-spoil': 'Pit spoil',
};

/** Words for each shape model, with what the crew measures for it. */
export const SHAPE_LABELS: Readonly<Record<PileData['shapeModel'], string>> = {
  cone: 'Cone (pointed heap)',
  'flat-topped': 'Flat-topped',
  surveyed: 'Surveyed (spot heights)',
  sacks: 'Sacks',
};

/** Words for each sample type. */
export const SAMPLE_TYPE_LABELS: Readonly<Record<SampleData['sampleType'], string>> = {
  routine: 'Routine',
  duplicate: 'Field duplicate',
  blank: 'Blank',
  standard: 'Reference standard',
};

/** Words for each colour size class, with the grain size a panner compares against. */
export const SIZE_CLASS_LABELS: Readonly<Record<(typeof COLOUR_SIZE_CLASSES)[number], string>> = {
  'very-coarse': 'Very coarse, 2–4.75 mm',
  coarse: 'Coarse, 0.85–2 mm',
  medium: 'Medium, 0.425–0.85 mm',
  fine: 'Fine, 0.15–0.425 mm',
  'very-fine': 'Very fine, 0.075–0.15 mm',
};

/** "1 photo", "3 photos". */
export function photoCount(count: number): string {
  return `${count} ${count === 1 ? 'photo' : 'photos'}`;
}
