// @ts-check
/**
 * The large invented demo scenario: one demo organisation of its own ("Demo: Petroleum Well
 * Compilation") with one dataset per invented survey area and, for N sites in all, bottom-hole
 * and interval heat flows from petroleum wells spread around each area's centre. Everything is
 * made by the database itself (INSERT … SELECT generate_series), so a million sites take a
 * minute, and everything hangs off the one organisation, so removing it (ON DELETE CASCADE)
 * removes every row it added. Used by `npm run seed:large` and by bench/map.bench.ts.
 *
 * Two of the areas are not public (one private, one embargoed far into the future), so the map's
 * aggregates have hidden sites to leave out at every zoom.
 */

/** The organisation every row of the scenario belongs to (its id marks the scenario). */
export const LARGE_ORG_ID = 'org-demo-large-wells';

/**
 * Invented survey areas: centre (°), spread (° standard deviation), base heat flow (mW/m²),
 * share of the sites, visibility. The names and numbers are made up.
 * @type {{ key: string, title: string, lon: number, lat: number, spread: number, baseMWm2: number, share: number, visibility: 'public' | 'private' | 'embargoed' }[]}
 */
export const LARGE_AREAS = [
	{
		key: 'ASB',
		title: 'Aldervik Shelf Basin wells',
		lon: 4.5,
		lat: 58.5,
		spread: 1.8,
		baseMWm2: 62,
		share: 0.16,
		visibility: 'public'
	},
	{
		key: 'MRT',
		title: 'Morrow Trough exploration wells',
		lon: -101.5,
		lat: 36.8,
		spread: 3.5,
		baseMWm2: 71,
		share: 0.2,
		visibility: 'public'
	},
	{
		key: 'KHP',
		title: 'Kessa High plateau wells',
		lon: 48.2,
		lat: 29.6,
		spread: 2.6,
		baseMWm2: 55,
		share: 0.12,
		visibility: 'public'
	},
	{
		key: 'TNR',
		title: 'Tanrel Rift wells',
		lon: 36.4,
		lat: 2.1,
		spread: 1.4,
		baseMWm2: 96,
		share: 0.08,
		visibility: 'public'
	},
	{
		key: 'CPB',
		title: 'Corvo Passive Margin wells',
		lon: -43.2,
		lat: -23.5,
		spread: 2.2,
		baseMWm2: 58,
		share: 0.1,
		visibility: 'public'
	},
	{
		key: 'WDB',
		title: 'Wendara Basin wells',
		lon: 134.5,
		lat: -26.0,
		spread: 4.0,
		baseMWm2: 84,
		share: 0.12,
		visibility: 'public'
	},
	{
		key: 'SGF',
		title: 'Sagai Foreland wells',
		lon: 109.2,
		lat: 37.4,
		spread: 2.0,
		baseMWm2: 66,
		share: 0.1,
		visibility: 'public'
	},
	{
		key: 'OKT',
		title: 'Okteyn Delta wells',
		lon: 6.8,
		lat: 5.2,
		spread: 1.2,
		baseMWm2: 52,
		share: 0.04,
		visibility: 'public'
	},
	{
		key: 'PRV',
		title: 'Aldervik Shelf confidential wells',
		lon: 4.5,
		lat: 58.5,
		spread: 1.8,
		baseMWm2: 140,
		share: 0.04,
		visibility: 'private'
	},
	{
		key: 'EMB',
		title: 'Morrow Trough 2030 campaign',
		lon: -101.5,
		lat: 36.8,
		spread: 3.5,
		baseMWm2: 150,
		share: 0.04,
		visibility: 'embargoed'
	}
];

/**
 * Seed `sites` sites in one transaction. Deterministic (setseed), so two runs give the same data.
 * @param {import('postgres').Sql} sql
 * @param {number} sites
 * @param {(message: string) => void} [log]
 */
export async function seedLarge(sql, sites, log = () => {}) {
	await sql.begin(async (tx) => {
		const [{ n }] =
			await tx`SELECT count(*)::int AS n FROM organisation WHERE id = ${LARGE_ORG_ID}`;
		if (n > 0) throw new Error('the large demo is seeded already; remove it first (--remove)');
		await tx`SET LOCAL synchronous_commit = off`;
		await tx`SELECT setseed(0.4242)`;
		await tx`INSERT INTO organisation (id, name, slug, country, description) VALUES
			(${LARGE_ORG_ID}, 'Demo: Petroleum Well Compilation', 'demo-petroleum-wells', NULL,
			 'Invented large demo scenario (npm run seed:large). Not real data.')`;
		let first = 0;
		for (const [i, area] of LARGE_AREAS.entries()) {
			const count = i === LARGE_AREAS.length - 1 ? sites - first : Math.round(sites * area.share);
			const [ds] = await tx`
				INSERT INTO dataset (organisation_id, title, abstract, licence, citation, status, visibility, embargo_until)
				VALUES (${LARGE_ORG_ID}, ${area.title},
					'Invented bottom-hole and interval heat flows of petroleum wells (large demo).',
					'CC-BY-4.0', ${`Demo Petroleum Well Compilation (2026): ${area.title}. Invented demo data.`},
					'published', ${area.visibility}::dataset_visibility,
					${area.visibility === 'embargoed' ? '2099-01-01' : null}::date)
				RETURNING id`;
			if (count <= 0) continue;
			// Box–Muller normal offsets around the centre; a smooth regional trend plus noise for
			// the heat flow; methods mostly bottom-hole temperatures, as in petroleum compilations.
			await tx`
				INSERT INTO site (dataset_id, code, name, location, heat_flow_mw_m2, heat_flow_sigma_mw_m2,
					method, quality_class, year_measured, bottom_depth_m)
				SELECT ${ds.id}::uuid, ${area.key}::text || '-' || lpad(g::text, 7, '0'),
					'Well ' || ${area.key}::text || ' ' || g,
					ST_SetSRID(ST_MakePoint(
						greatest(-179.9, least(179.9, ${area.lon}::float8 + ${area.spread}::float8 * nx)),
						greatest(-84, least(84, ${area.lat}::float8 + ${area.spread}::float8 * 0.7 * ny))), 4326),
					round((${area.baseMWm2}::float8 + 12 * sin(nx * 1.7) * cos(ny * 1.3) + 9 * nz)::numeric, 1)::float8,
					round((${area.baseMWm2}::float8 * (0.05 + 0.25 * r)) ::numeric, 1)::float8,
					(CASE WHEN m < 0.72 THEN 'bottom_hole_temperature' WHEN m < 0.93 THEN 'borehole_interval' ELSE 'bullard' END)::heat_flow_method,
					(CASE WHEN m >= 0.72 AND r < 0.3 THEN 'well-constrained' WHEN r < 0.45 THEN 'constrained'
						WHEN r < 0.85 THEN 'indicative' ELSE 'unconstrained' END)::quality_class,
					1955 + floor(random() * 70)::int,
					800 + round(random() * 4200)
				FROM (
					SELECT g,
						sqrt(-2 * ln(1 - random())) * cos(2 * pi() * random()) AS nx,
						sqrt(-2 * ln(1 - random())) * cos(2 * pi() * random()) AS ny,
						sqrt(-2 * ln(1 - random())) * cos(2 * pi() * random()) AS nz,
						random() AS r, random() AS m
					FROM generate_series(${first}::int, ${first + count - 1}::int) AS g
				) AS draws`;
			log(`${area.title}: ${count} sites (${area.visibility})`);
			first += count;
		}
		// A short temperature log for one well in 200 (so "has a temperature log" filters something).
		await tx`
			INSERT INTO temperature_log (site_id, name, depth_m, temperature_c)
			SELECT s.id, 'Demo log', ARRAY[100, 500, 1000, 1500]::float8[],
				ARRAY[12, 12 + 0.4 * s.heat_flow_mw_m2 / 2.5, 12 + 0.8 * s.heat_flow_mw_m2 / 2.5, 12 + 1.2 * s.heat_flow_mw_m2 / 2.5]::float8[]
			FROM site s JOIN dataset d ON d.id = s.dataset_id
			WHERE d.organisation_id = ${LARGE_ORG_ID} AND hashtext(s.code) % 200 = 0`;
	});
	await sql`ANALYZE site`;
	await sql`ANALYZE temperature_log`;
	// Build the map's pre-built cells now (migration 0015) rather than on the first map request.
	for (const { id } of await sql`SELECT dataset_id AS id FROM map_cell_stale`) {
		await sql`SELECT map_cell_refresh(${id}::uuid)`;
	}
	await sql`ANALYZE map_cell`;
}

/**
 * Remove everything the scenario added: the organisation, and through ON DELETE CASCADE its
 * datasets, their sites and everything hanging off them. Returns the number of sites removed.
 * @param {import('postgres').Sql} sql
 */
export async function removeLarge(sql) {
	return sql.begin(async (tx) => {
		const [{ n }] = await tx`
			SELECT count(*)::int AS n FROM site s JOIN dataset d ON d.id = s.dataset_id
			WHERE d.organisation_id = ${LARGE_ORG_ID}`;
		await tx`DELETE FROM organisation WHERE id = ${LARGE_ORG_ID}`;
		return n;
	});
}
