/// <reference lib="webworker" />
/**
 * The heat map, off the main thread: the engine's `idwGrid` over the samples, painted with our
 * ramp into a PNG. The page posts typed arrays (transferred, not copied) and lays the PNG over the
 * map, so the page stays responsive while ten thousand samples are weighed.
 */
import { idwGrid, type HeatmapSample } from '../../../../shared/engine';
import { paintGrid, pixelsToPng } from './heatmap-paint';
import type { HeatmapRequest, HeatmapResponse } from './heatmap-protocol';

addEventListener('message', (event: MessageEvent<HeatmapRequest>) => {
  void answer(event.data).then((response) => postMessage(response));
});

async function answer(request: HeatmapRequest): Promise<HeatmapResponse> {
  const started = performance.now();
  const samples: HeatmapSample[] = new Array(request.lons.length);
  for (let index = 0; index < request.lons.length; index += 1) {
    samples[index] = { lon: request.lons[index], lat: request.lats[index], value: request.values[index] };
  }
  const grid = idwGrid(samples, request.grid);
  if (!grid.ok) {
    return { requestId: request.requestId, ok: false, errors: grid.errors.map((error) => error.message) };
  }
  const { values, hasValue, columns, rows, minValue, maxValue, emptyCellCount, cellWidthM, cellHeightM } = grid.value;
  const png = await pixelsToPng(paintGrid(values, hasValue, minValue, maxValue), columns, rows);
  return {
    requestId: request.requestId, ok: true, png, minValue, maxValue, emptyCellCount, cellWidthM, cellHeightM,
    columns, rows, computeMs: performance.now() - started,
  };
}
