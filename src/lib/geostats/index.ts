/*
 * Thermalith geostatistics core: pure TypeScript (no DOM, Node, SvelteKit or database
 * imports), so it runs in a worker on the server or in the browser. Coordinates are
 * projected metres; the grid and variogram conventions are in README.md beside this file and
 * the methods in docs/science.md#interpolation.
 */
export type { Sample, GridSpec, VariogramModel, Variogram, VariogramPoint } from './types';
// InputError is the one error type of all pure modules; re-exported for the geostatistics API's callers.
export { InputError } from '../foundation/errors';
export { SingularSystemError } from './errors';
export { MAX_GRID_CELLS, cellCentreX, cellCentreY, cellIndex, gridFromExtent } from './grid';
export {
	inverseDistanceGrid,
	idwRows,
	idwEverySitePower2Rows,
	type IdwEverySiteInputs,
	type IdwOptions,
	type IdwRows
} from './idw';
export { semivariance, sill, structure } from './variogram';
export { empiricalVariogram, defaultLagClasses, DEFAULT_LAGS } from './empirical';
export {
	fitVariogram,
	fitBestVariogram,
	rankVariogramModels,
	fitVariogramToPoints,
	wlsObjective
} from './fit';
export {
	ordinaryKrigingGrid,
	krigingRows,
	krigePoint,
	type KrigingOptions,
	type KrigingRows
} from './kriging';
export { crossValidate, crossValidationResiduals, type CrossValidationResidual } from './crossval';
export { assertNoExactDuplicates, mergeDuplicateSamples } from './duplicates';
export { maskByDistance } from './mask';
export {
	contourGrid,
	contoursToProjected,
	gridToProjected,
	type ContourCollection,
	type ContourProperties
} from './contours';
export { simulateGaussianField } from './simulate';
