/** Properties of a site feature in /api/v1/sites.geojson, as the map reads them. */
export interface SiteProperties {
	id: string;
	code: string;
	name: string | null;
	heatFlowMWm2: number | null;
	heatFlowSigmaMWm2: number | null;
	method: string;
	qualityClass: string | null;
	datasetTitle: string;
	organisationName: string;
}
