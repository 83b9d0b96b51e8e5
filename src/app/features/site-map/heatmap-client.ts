import type { GridSpec } from '../../../../shared/engine';
import type { HeatmapRequest, HeatmapResponse } from './heatmap-protocol';

/** Points for the heat map as typed arrays (positions in degrees, values in g/t). */
export interface HeatmapPoints {
  readonly lons: Float64Array;
  readonly lats: Float64Array;
  readonly values: Float64Array;
}

/** Talks to the heat-map worker: one request at a time, the latest answer wins. */
export class HeatmapClient {
  private readonly worker = new Worker(new URL('./heatmap.worker', import.meta.url), { type: 'module' });
  private nextId = 1;
  private readonly waiting = new Map<number, (response: HeatmapResponse) => void>();

  constructor() {
    this.worker.addEventListener('message', (event: MessageEvent<HeatmapResponse>) => {
      this.waiting.get(event.data.requestId)?.(event.data);
      this.waiting.delete(event.data.requestId);
    });
  }

  /** Fills the grid from the points in the worker; the arrays are handed over (transferred). */
  compute(points: HeatmapPoints, grid: GridSpec): Promise<HeatmapResponse> {
    const requestId = this.nextId++;
    const request: HeatmapRequest = { requestId, ...points, grid };
    return new Promise((resolve) => {
      this.waiting.set(requestId, resolve);
      this.worker.postMessage(request, [points.lons.buffer, points.lats.buffer, points.values.buffer]);
    });
  }

  /** Stops the worker (the page is leaving). */
  terminate(): void {
    this.worker.terminate();
    this.waiting.clear();
  }
}
