import { sql } from 'drizzle-orm';
import type { SiteDraft } from '$lib/imports';
import type { Db } from '../db/client';

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

/** Rows per statement: one array parameter per column, so a statement's size grows with it. */
export const INSERT_CHUNK_ROWS = 5000;

const col = <T>(rows: SiteDraft[], get: (s: SiteDraft) => T) => rows.map(get);

/**
 * Insert sites with `INSERT … SELECT FROM unnest(…)`: one array per column instead of one
 * parameter per value, so 5000 rows are one short statement (PostgreSQL allows 65 535 parameters;
 * a VALUES list of 30 columns stops at 2184 rows and is parsed row by row). Array columns
 * (corrections, flags) travel as comma-joined text: their values are closed lists without commas.
 */
export async function insertSiteChunk(
	tx: Tx,
	datasetId: string,
	batchId: string,
	rows: SiteDraft[]
): Promise<void> {
	const p = (v: unknown[], type: string) => sql`${sql.param(v)}::${sql.raw(type)}`;
	await tx.execute(sql`
		INSERT INTO site (
			dataset_id, import_batch_id, code, name, location, original_x, original_y, original_epsg,
			elevation_m, water_depth_m, top_depth_m, bottom_depth_m, heat_flow_mw_m2,
			heat_flow_sigma_mw_m2, gradient_k_per_km, gradient_sigma_k_per_km, conductivity_w_mk,
			conductivity_sigma_w_mk, conductivity_samples, conductivity_method, heat_production_uw_m3,
			heat_production_sigma_uw_m3, surface_temperature_c, method, corrections, year_measured,
			remarks, quality_class, flags
		)
		SELECT ${datasetId}::uuid, ${batchId}::uuid, r.code, r.name,
			ST_SetSRID(ST_MakePoint(r.lon, r.lat), 4326), r.ox, r.oy, r.oepsg,
			r.elev, r.water, r.top, r.bottom, r.q, r.qs, r.g, r.gs, r.k, r.ks, r.kn, r.km, r.a, r.as_,
			r.ts, r.method::heat_flow_method, string_to_array(r.corr, ','), r.year, r.remarks,
			r.quality::quality_class, string_to_array(r.flags, ',')
		FROM unnest(
			${p(
				col(rows, (s) => s.code),
				'text[]'
			)}, ${p(
				col(rows, (s) => s.name),
				'text[]'
			)},
			${p(
				col(rows, (s) => s.location.lon),
				'float8[]'
			)}, ${p(
				col(rows, (s) => s.location.lat),
				'float8[]'
			)},
			${p(
				col(rows, (s) => s.originalX),
				'float8[]'
			)}, ${p(
				col(rows, (s) => s.originalY),
				'float8[]'
			)},
			${p(
				col(rows, (s) => s.originalEpsg),
				'int4[]'
			)},
			${p(
				col(rows, (s) => s.elevationM),
				'float8[]'
			)}, ${p(
				col(rows, (s) => s.waterDepthM),
				'float8[]'
			)},
			${p(
				col(rows, (s) => s.topDepthM),
				'float8[]'
			)}, ${p(
				col(rows, (s) => s.bottomDepthM),
				'float8[]'
			)},
			${p(
				col(rows, (s) => s.heatFlowMWm2),
				'float8[]'
			)}, ${p(
				col(rows, (s) => s.heatFlowSigmaMWm2),
				'float8[]'
			)},
			${p(
				col(rows, (s) => s.gradientKPerKm),
				'float8[]'
			)}, ${p(
				col(rows, (s) => s.gradientSigmaKPerKm),
				'float8[]'
			)},
			${p(
				col(rows, (s) => s.conductivityWmK),
				'float8[]'
			)}, ${p(
				col(rows, (s) => s.conductivitySigmaWmK),
				'float8[]'
			)},
			${p(
				col(rows, (s) => s.conductivitySamples),
				'int4[]'
			)}, ${p(
				col(rows, (s) => s.conductivityMethod),
				'text[]'
			)},
			${p(
				col(rows, (s) => s.heatProductionUWm3),
				'float8[]'
			)}, ${p(
				col(rows, (s) => s.heatProductionSigmaUWm3),
				'float8[]'
			)},
			${p(
				col(rows, (s) => s.surfaceTemperatureC),
				'float8[]'
			)}, ${p(
				col(rows, (s) => s.method),
				'text[]'
			)},
			${p(
				col(rows, (s) => s.corrections.join(',')),
				'text[]'
			)}, ${p(
				col(rows, (s) => s.yearMeasured),
				'int4[]'
			)},
			${p(
				col(rows, (s) => s.remarks),
				'text[]'
			)}, ${p(
				col(rows, (s) => s.qualityClass),
				'text[]'
			)},
			${p(
				col(rows, (s) => (s.flags ?? []).join(',')),
				'text[]'
			)}
		) AS r(code, name, lon, lat, ox, oy, oepsg, elev, water, top, bottom, q, qs, g, gs, k, ks, kn, km,
			a, as_, ts, method, corr, year, remarks, quality, flags)`);
}
