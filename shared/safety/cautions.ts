/**
 * Safety cautions shown where the work happens (DESIGN §8). Plain words for crews, with the
 * sources they follow. These are reminders, not a safety programme: local mining law, the site's
 * own rules and licensed practice come first.
 */

/** Hazards a crew can record on a pile; each maps to one caution. */
export const HAZARDS = ['mercury', 'silica-dust', 'unstable-face', 'cyanide', 'deep-water', 'traffic'] as const;

/** A hazard seen on or near a pile. */
export type Hazard = (typeof HAZARDS)[number];

/** One caution: a short title, what to do, and where the advice comes from. */
export interface Caution {
  readonly hazard: Hazard;
  readonly icon: string;
  readonly title: string;
  readonly actions: readonly string[];
  readonly source: string;
}

/** The cautions, one per hazard, in the order of how often they apply to old tailings. */
export const CAUTIONS: readonly Caution[] = [
  {
    hazard: 'mercury',
    icon: 'science',
    title: 'Mercury may be in old tailings',
    actions: [
      'Wear gloves when handling tailings and concentrate.',
      'Do not eat, drink or smoke at the pile; wash hands before meals.',
      'Never heat amalgam or concentrate in the open or indoors where people live.',
      'Do not leach tailings that held mercury with cyanide.',
    ],
    source: 'WHO 2016 ASGM health hazards; Minamata Convention, Art. 7 and Annex C; UNEP 2012 practical guide',
  },
  {
    hazard: 'silica-dust',
    icon: 'masks',
    title: 'Silica dust from dry crushing and milling',
    actions: [
      'Wear a dust mask (P2/N95 or better) near dry crushing, milling or sieving.',
      'Wet the material before breaking, milling or splitting samples.',
      'Keep children and others away from the dust.',
    ],
    source: 'IARC Monograph 100C (crystalline silica); ILO 2001 small-scale surface mines handbook',
  },
  {
    hazard: 'unstable-face',
    icon: 'landslide',
    title: 'Pile faces and pit walls collapse',
    actions: [
      'Do not undercut a face or dig into the toe of a steep pile.',
      'Never sample under an overhang; take the sample from a safe position.',
      'Stay back from pit edges; work in pairs.',
    ],
    source: 'ILO 2001, "Safety and Health in Small-scale Surface Mines" (walls, undercutting, overhangs)',
  },
  {
    hazard: 'cyanide',
    icon: 'dangerous',
    title: 'Cyanide is for licensed plants only',
    actions: [
      'Do not handle cyanide solutions or leach residues.',
      'Report leach ponds and drums; keep away from them.',
    ],
    source: 'Minamata Convention Annex C; UNEP 2012 practical guide',
  },
  {
    hazard: 'deep-water',
    icon: 'pool',
    title: 'Flooded pits and settling ponds',
    actions: ['Do not enter water of unknown depth.', 'Keep children away from ponds and flooded pits.'],
    source: 'common practice, no source',
  },
  {
    hazard: 'traffic',
    icon: 'local_shipping',
    title: 'Trucks and loaders',
    actions: ['Stay where drivers can see you.', 'Do not sample on haul roads while vehicles move.'],
    source: 'common practice, no source',
  },
];

/** The statement that every figure Heapsight shows is a planning estimate. */
export const PLANNING_ESTIMATE_STATEMENT =
  'The tonnages, grades and values are estimates for planning, not a resource statement. ' +
  'Local mining law, the site\u2019s permits and licensed practice come first.';

/** The caution for one hazard. */
export function cautionFor(hazard: Hazard): Caution {
  const caution = CAUTIONS.find((candidate) => candidate.hazard === hazard);
  if (!caution) {
    throw new Error(`No caution for hazard "${hazard}"`);
  }
  return caution;
}
