// The plain object a valid upload row becomes: the site table's insert shape without datasetId,
// ids or timestamps (src/lib/server/db/schema/sites.ts), with the computed quality class.

import type { SiteFlag } from '../sites/flags';
import type { QualityClass } from '../sites/quality';
import type { Correction, HeatFlowMethod } from './vocabulary';

export interface SiteDraft {
	code: string;
	name: string | null;
	/** WGS 84 longitude/latitude, degrees. */
	location: { lon: number; lat: number };
	originalX: number | null;
	originalY: number | null;
	originalEpsg: number | null;
	elevationM: number | null;
	waterDepthM: number | null;
	topDepthM: number | null;
	bottomDepthM: number | null;
	heatFlowMWm2: number | null;
	heatFlowSigmaMWm2: number | null;
	gradientKPerKm: number | null;
	gradientSigmaKPerKm: number | null;
	conductivityWmK: number | null;
	conductivitySigmaWmK: number | null;
	conductivitySamples: number | null;
	conductivityMethod: string | null;
	heatProductionUWm3: number | null;
	heatProductionSigmaUWm3: number | null;
	surfaceTemperatureC: number | null;
	method: HeatFlowMethod;
	corrections: Correction[];
	yearMeasured: number | null;
	remarks: string | null;
	qualityClass: QualityClass;
	/** Warnings the contributor imported anyway (`src/lib/sites/flags.ts`). */
	flags: SiteFlag[];
}
