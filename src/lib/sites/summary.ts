import { z } from 'zod';
import { HEAT_FLOW_METHODS } from './methods';
import { QUALITY_CLASSES } from './quality';

/**
 * The one site summary shape: a row of the dataset site table, and (without lon/lat, which become
 * the geometry) the properties of a feature in /api/v1/sites.geojson that the map reads. The
 * server selects exactly these columns (siteSummaryColumns in server/repositories/sites.ts, checked
 * against this type); the browser can parse an API answer with the same schema.
 */
export const siteSummarySchema = z.object({
	id: z.uuid(),
	code: z.string(),
	name: z.string().nullable(),
	/** WGS 84 degrees. */
	lon: z.number(),
	lat: z.number(),
	heatFlowMWm2: z.number().nullable(),
	heatFlowSigmaMWm2: z.number().nullable(),
	method: z.enum(HEAT_FLOW_METHODS),
	qualityClass: z.enum(QUALITY_CLASSES).nullable(),
	yearMeasured: z.number().int().nullable(),
	datasetTitle: z.string(),
	organisationName: z.string()
});

export type SiteSummary = z.output<typeof siteSummarySchema>;

/** A GeoJSON feature's properties: the summary without the position (that is the geometry). */
export const siteFeaturePropertiesSchema = siteSummarySchema.omit({ lon: true, lat: true });
export type SiteFeatureProperties = z.output<typeof siteFeaturePropertiesSchema>;
