import type { VariogramModel, VariogramPoint } from '../geostats';
import type { GridStatus } from './status';

/** What `GET /api/v1/grids/{id}` answers, as the map's grid panel reads it. */
export interface GridStatusView {
	id: string;
	status: GridStatus;
	progress: number;
	error: string | null;
	request: {
		method: 'kriging' | 'idw';
		bbox: [number, number, number, number];
		cellSizeM: number;
		maskDistanceM?: number;
		/** The drawn region the grid is clipped to, when it was a polygon. */
		polygon?: [number, number][];
	};
	crs: { epsg: number; name: string };
	boundsWgs84: [number, number, number, number];
	sitesUsed: number;
	variogram: {
		model: VariogramModel;
		nuggetMWm2: number;
		sillMWm2: number;
		rangeM: number;
		source: 'fitted' | 'user' | 'default';
		note: string | null;
		meanMeasurementVarianceMWm2: number;
	} | null;
	measurementError: string | null;
	empiricalVariogram: VariogramPoint[];
	crossValidation: {
		rmseMWm2: number;
		meanErrorMWm2: number;
		meanStandardisedError: number | null;
		rmsStandardisedError: number | null;
		pairs: [number, number][];
	} | null;
	links: {
		geotiff: string;
		sigmaGeotiff: string | null;
		csv: string;
		png: string;
		sigmaPng: string | null;
		contours: string;
		temperatureAtDepth: string;
		isothermDepth: string;
		temperatureAtDepthPng: string;
		isothermDepthPng: string;
	} | null;
	caution: string;
	atDepthAssumptions: string;
}
