/**
 * Heapsight numbers engine: the one way in for the client and the server (DESIGN §7).
 * Pure functions, plain data in and out; expected failures come back as `Result` values.
 * See README.md in this folder for units, formulas, limits and sources per module.
 */
export * from './result';
export * from './units';
export { parseFootprint, measureFootprint, metricsOf, geodesicDistanceM, centroidDistanceM } from './footprint';
export type { Footprint, FootprintMetrics, LonLat, PlanePoint } from './footprint';
export * from './volume';
export * from './tonnage';
export * from './panTest';
export * from './gradeStats';
export { seededRandom, normalQuantile } from './random';
export * from './sampleMass';
export * from './calibration';
export * from './qaqc';
export * from './trial';
export * from './heatmap';
export * from './shortlist';
export * from './estimate';
export * from './qcInsertion';
