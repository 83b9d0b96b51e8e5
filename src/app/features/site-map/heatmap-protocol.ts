import type { GridSpec } from '../../../../shared/engine';

/** What the page asks of the heat-map worker: sample positions and values, and the grid to fill. */
export interface HeatmapRequest {
  readonly requestId: number;
  readonly lons: Float64Array;
  readonly lats: Float64Array;
  readonly values: Float64Array;
  readonly grid: GridSpec;
}

/** The worker's answer: a PNG of the painted grid and its range, or why there is none. */
export type HeatmapResponse =
  | {
      readonly requestId: number;
      readonly ok: true;
      readonly png: Blob;
      readonly minValue: number;
      readonly maxValue: number;
      readonly emptyCellCount: number;
      readonly cellWidthM: number;
      readonly cellHeightM: number;
      readonly columns: number;
      readonly rows: number;
      readonly computeMs: number;
    }
  | { readonly requestId: number; readonly ok: false; readonly errors: readonly string[] };

/** Columns and rows of the heat-map grid: 200 × 200 cells resolve a pile of 10 m on a 1 km site. */
export const HEATMAP_GRID_SIDE = 200;
