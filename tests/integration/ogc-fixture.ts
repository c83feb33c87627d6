import { inArray } from 'drizzle-orm';
import { createDb } from '../../src/lib/server/db/client';
import { dataset, site, type NewDataset } from '../../src/lib/server/db/schema';
import { testEnv } from './env';
import { Client, DEMO_PASSWORD, signIn } from './http';

/**
 * Invented data for the /ogc tests, in a box of the Arctic Ocean of its own (lon 140–141, lat
 * 70–71 plus two sites beside the antimeridian), owned by the Korvald demo organisation:
 * - `open`: published and public, 23 sites in the box (years 2000–2010 and some without a year)
 *   and 2 across the antimeridian;
 * - `hidden`: published but private, 3 sites (only Korvald members see them);
 * - `draft`: a public draft, 2 sites (members see them on the map, not as a dataset collection).
 */
export const BOX = '140,70,141,71';
export const ACROSS = '179,70,-179,71';
export const OPEN_IN_BOX = 23;

export interface OgcFixture {
	run: string;
	open: { dataset: string; sites: string[]; across: string[] };
	hidden: { dataset: string; sites: string[] };
	draft: { dataset: string; sites: string[] };
	years: Map<string, number | null>;
	close: () => Promise<void>;
}

export async function createOgcFixture(): Promise<OgcFixture> {
	const { db, client } = createDb(testEnv.databaseUrl(), { max: 2 });
	const run = Date.now().toString(36);
	const make = async (name: string, state: Partial<NewDataset>) => {
		const [d] = await db
			.insert(dataset)
			.values({
				organisationId: 'org-korvald-survey',
				title: `OGC ${name} ${run}`,
				licence: 'CC-BY-4.0',
				citation: `Invented citation for OGC ${name} ${run}`,
				...state
			} as NewDataset)
			.returning({ id: dataset.id });
		return d.id;
	};
	const open = await make('open', { status: 'published', visibility: 'public' });
	const hidden = await make('hidden', { status: 'published', visibility: 'private' });
	const draft = await make('draft', { status: 'draft', visibility: 'public' });
	const years = new Map<string, number | null>();
	const add = async (datasetId: string, points: { lon: number; lat: number }[], prefix: string) => {
		const rows = await db
			.insert(site)
			.values(
				points.map((location, i) => ({
					datasetId,
					code: `${prefix}-${i}-${run}`,
					location,
					heatFlowMWm2: 50 + i,
					// Every fourth site has no year: datetime matches it whatever the interval.
					yearMeasured: i % 4 === 3 ? null : 2000 + (i % 11)
				}))
			)
			.returning({ id: site.id, year: site.yearMeasured });
		for (const r of rows) years.set(r.id, r.year);
		return rows.map((r) => r.id);
	};
	const grid = (n: number, offset: number) =>
		Array.from({ length: n }, (_, i) => ({
			lon: 140.05 + (i % 5) * 0.2,
			lat: 70.05 + Math.floor(i / 5) * 0.15 + offset
		}));
	const openSites = await add(open, grid(OPEN_IN_BOX, 0), 'OGC-O');
	const across = await add(
		open,
		[
			{ lon: 179.9, lat: 70.5 },
			{ lon: -179.9, lat: 70.5 }
		],
		'OGC-A'
	);
	const hiddenSites = await add(hidden, grid(3, 0.01), 'OGC-H');
	const draftSites = await add(draft, grid(2, 0.02), 'OGC-D');
	return {
		run,
		open: { dataset: open, sites: openSites, across },
		hidden: { dataset: hidden, sites: hiddenSites },
		draft: { dataset: draft, sites: draftSites },
		years,
		close: async () => {
			await db.delete(dataset).where(inArray(dataset.id, [open, hidden, draft]));
			await client.end();
		}
	};
}

/** Callers: anonymous, a member of the data's organisation, and a member of another one. */
export async function ogcClients() {
	return {
		anonymous: new Client(),
		member: await signIn('viewer@korvald-survey.example', DEMO_PASSWORD),
		outsider: await signIn('owner@lindmark-thermics.example', DEMO_PASSWORD)
	};
}

export type Caller = keyof Awaited<ReturnType<typeof ogcClients>>;

/** GET an /ogc address (path or absolute link) as a GIS client would: JSON, with the caller's session. */
export function ogcGet(
	client: Client,
	pathOrUrl: string,
	headers: Record<string, string> = {}
): Promise<Response> {
	const url = new URL(pathOrUrl, testEnv.appUrl());
	const path = url.pathname + url.search;
	return client.json(path, undefined, 'GET', {
		accept: 'application/geo+json, application/json',
		...headers
	});
}
