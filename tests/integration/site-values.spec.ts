import { and, count, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb } from '../../src/lib/server/db/client';
import {
	auditEvent,
	conductivitySample,
	dataset,
	importBatch,
	site,
	siteComputation,
	siteValueRevision,
	temperatureLog,
	type NewDataset
} from '../../src/lib/server/db/schema';
import { testEnv } from './env';
import { Client, DEMO_PASSWORD, signIn } from './http';

/*
 * Site values with history and the site computations, through the site page's actions as a
 * browser posts them: a log-derived heat flow is a new revision beside the submitted values;
 * choosing a revision makes it current (and only then changes what the map reads); Horner,
 * palaeoclimate and heat-production results are stored with their inputs; a member without the
 * upload right is refused and nothing changes.
 */

const ORG = 'org-korvald-survey';
const run = Date.now().toString(36);
const { db, client: sql } = createDb(testEnv.databaseUrl(), { max: 2 });
let contributor: Client;
let orgViewer: Client;
let siteId = '';
let logId = '';

// Invented log: 10 °C at 0 m, 30 K/km, one unit k = 2.0 ± 0.1 W/(m·K) → q = 60 mW/m².
const depthM = [100, 200, 300, 400, 500, 600];
const temperatureC = depthM.map((z) => 10 + 0.03 * z);

const post = (c: Client, action: string, fields: Record<string, string>) =>
	c.post(`/sites/${siteId}?/${action}`, fields);

async function siteRow() {
	const [row] = await db.select().from(site).where(eq(site.id, siteId));
	return row;
}
async function counts() {
	const [[r], [c], [l], [a]] = await Promise.all([
		db.select({ n: count() }).from(siteValueRevision).where(eq(siteValueRevision.siteId, siteId)),
		db.select({ n: count() }).from(siteComputation).where(eq(siteComputation.siteId, siteId)),
		db.select({ n: count() }).from(temperatureLog).where(eq(temperatureLog.siteId, siteId)),
		db.select({ n: count() }).from(auditEvent).where(eq(auditEvent.action, 'site_values_current'))
	]);
	return { revisions: r.n, computations: c.n, logs: l.n, chosen: a.n };
}

beforeAll(async () => {
	contributor = await signIn('contributor@korvald-survey.example', DEMO_PASSWORD);
	orgViewer = await signIn('viewer@korvald-survey.example', DEMO_PASSWORD);
	const [d] = await db
		.insert(dataset)
		.values({
			organisationId: ORG,
			title: `Site values ${run}`,
			licence: 'CC-BY-4.0',
			status: 'draft',
			visibility: 'private'
		} as NewDataset)
		.returning({ id: dataset.id });
	const [s] = await db
		.insert(site)
		.values({
			datasetId: d.id,
			code: `SV-${run}`,
			location: { lon: 101.3, lat: -58.7 },
			heatFlowMWm2: 70,
			heatFlowSigmaMWm2: 7,
			gradientKPerKm: 28,
			conductivityWmK: 2.5,
			method: 'other',
			qualityClass: 'indicative'
		})
		.returning({ id: site.id });
	siteId = s.id;
	const [log] = await db
		.insert(temperatureLog)
		.values({ siteId, name: 'SV-log.csv', depthM, temperatureC })
		.returning({ id: temperatureLog.id });
	logId = log.id;
	await db
		.insert(conductivitySample)
		.values({ siteId, topM: 0, bottomM: 700, conductivityWmK: 2.0, sigmaWmK: 0.1 });
});

afterAll(async () => {
	await sql.end();
});

describe('site values with history', () => {
	it('a log-derived heat flow kept as a revision leaves the submitted values current', async () => {
		const res = await post(contributor, 'compute', {
			logId,
			method: 'interval',
			fromM: '100',
			toM: '600',
			save: '1'
		});
		expect(res.status).toBe(200);
		const s = await siteRow();
		// The site (what the map reads) still has the submitted values.
		expect(s.heatFlowMWm2).toBe(70);
		expect(s.gradientKPerKm).toBe(28);
		expect(s.method).toBe('other');
		expect(s.currentRevisionId).toBeNull();
		const revisions = await db
			.select()
			.from(siteValueRevision)
			.where(eq(siteValueRevision.siteId, siteId));
		expect(revisions.map((r) => r.source).sort()).toEqual(['log_computation', 'submitted']);
		const submitted = revisions.find((r) => r.source === 'submitted')!;
		expect(submitted).toMatchObject({ heatFlowMWm2: 70, heatFlowSigmaMWm2: 7, method: 'other' });
		const computed = revisions.find((r) => r.source === 'log_computation')!;
		expect(computed.heatFlowMWm2).toBeCloseTo(60, 9);
		expect(computed.conductivityWmK).toBeCloseTo(2, 12);
		// σk̄ of one unit is its own σ; σq = Γ σk here (noise-free log).
		expect(computed.conductivitySigmaWmK).toBeCloseTo(0.1, 12);
		expect(computed.heatFlowSigmaMWm2).toBeCloseTo(3, 9);
		expect(computed.method).toBe('borehole_interval');
		expect(computed.computationId).not.toBeNull();
		// The page lists both, the submitted one marked current.
		const page = await (await contributor.get(`/sites/${siteId}`)).text();
		expect(page).toContain('Computed from a log');
		expect(page).toMatch(/data-current="true"[^]*?As submitted/);
	});

	it('choosing a revision copies it onto the site; choosing the submitted one restores it', async () => {
		const [computed] = await db
			.select()
			.from(siteValueRevision)
			.where(
				and(eq(siteValueRevision.siteId, siteId), eq(siteValueRevision.source, 'log_computation'))
			);
		expect((await post(contributor, 'choose', { revisionId: computed.id })).status).toBe(200);
		let s = await siteRow();
		expect(s.currentRevisionId).toBe(computed.id);
		expect(s.heatFlowMWm2).toBeCloseTo(60, 9);
		expect(s.method).toBe('borehole_interval');
		expect(s.topDepthM).toBe(100);
		// Quality recomputed from the chosen values: σ/q = 5 %, borehole method, 1 sample.
		expect(s.qualityClass).not.toBe('indicative');

		const [submitted] = await db
			.select()
			.from(siteValueRevision)
			.where(and(eq(siteValueRevision.siteId, siteId), eq(siteValueRevision.source, 'submitted')));
		expect((await post(contributor, 'choose', { revisionId: submitted.id })).status).toBe(200);
		s = await siteRow();
		expect(s).toMatchObject({ heatFlowMWm2: 70, gradientKPerKm: 28, method: 'other' });
		expect(s.currentRevisionId).toBe(submitted.id);
	});

	it('a manual correction needs a reason and is kept with it, not made current', async () => {
		const before = await counts();
		const refused = await post(contributor, 'correct', {
			heatFlowMWm2: '72',
			method: 'other',
			reason: ''
		});
		expect(refused.status).toBe(400);
		expect(await refused.text()).toContain('Say why the values are corrected');
		expect(await counts()).toEqual(before);

		const res = await post(contributor, 'correct', {
			heatFlowMWm2: '72.5',
			heatFlowSigmaMWm2: '6',
			method: 'other',
			reason: 'Heat flow re-read from the field sheet'
		});
		expect(res.status).toBe(200);
		const [fix] = await db
			.select()
			.from(siteValueRevision)
			.where(and(eq(siteValueRevision.siteId, siteId), eq(siteValueRevision.source, 'correction')));
		expect(fix).toMatchObject({
			heatFlowMWm2: 72.5,
			reason: 'Heat flow re-read from the field sheet'
		});
		expect((await siteRow()).heatFlowMWm2).toBe(70);
	});

	it('refuses a revision of another site', async () => {
		const [other] = await db.select({ id: siteValueRevision.id }).from(siteValueRevision).limit(1);
		const foreign = await db
			.select({ id: siteValueRevision.id })
			.from(siteValueRevision)
			.where(eq(siteValueRevision.siteId, siteId));
		const notOurs = foreign.some((r) => r.id === other.id)
			? '00000000-0000-4000-8000-000000000000'
			: other.id;
		const res = await post(contributor, 'choose', { revisionId: notOurs });
		expect(res.status).toBe(404);
	});
});

describe('provenance of the submitted values', () => {
	it('names the import whose run stored the site, and who ran it', async () => {
		const [d] = await db
			.insert(dataset)
			.values({
				organisationId: ORG,
				title: `Site values import ${run}`,
				licence: 'CC-BY-4.0',
				status: 'draft',
				visibility: 'private'
			} as NewDataset)
			.returning({ id: dataset.id });
		const [owner] = await sql<{ id: string }[]>`
			SELECT id FROM "user" WHERE email = 'contributor@korvald-survey.example'`;
		const started = new Date(Date.now() - 60_000);
		const [batch] = await db
			.insert(importBatch)
			.values({
				datasetId: d.id,
				fileName: `field-${run}.csv`,
				fileSha256: 'a'.repeat(64),
				totalRows: 1,
				doneRows: 1,
				status: 'done',
				createdBy: owner.id,
				createdAt: started,
				finishedAt: new Date(Date.now() + 60_000)
			})
			.returning({ id: importBatch.id });
		const [s] = await db
			.insert(site)
			.values({
				datasetId: d.id,
				code: `SV-IMP-${run}`,
				location: { lon: 101.4, lat: -58.6 },
				heatFlowMWm2: 55,
				createdAt: new Date(started.getTime() + 1000)
			})
			.returning({ id: site.id });
		const res = await contributor.post(`/sites/${s.id}?/correct`, {
			heatFlowMWm2: '56',
			method: 'other',
			reason: 'Rounded differently in the report'
		});
		expect(res.status).toBe(200);
		const [submitted] = await db
			.select()
			.from(siteValueRevision)
			.where(and(eq(siteValueRevision.siteId, s.id), eq(siteValueRevision.source, 'submitted')));
		expect(submitted.importBatchId).toBe(batch.id);
		expect(submitted.createdBy).toBe(owner.id);
		expect(submitted.heatFlowMWm2).toBe(55);
		const page = await (await contributor.get(`/sites/${s.id}`)).text();
		expect(page).toContain(`Imported from field-${run}.csv by`);
		expect(page).toContain('Reason: Rounded differently in the report');
	});
});

describe('site computations stored with their inputs', () => {
	it('Horner formation temperature from bottom-hole temperatures', async () => {
		// Invented readings on T = 120 − 10 ln((4 + Δt)/Δt) (Horner 1951): T∞ = 120 °C.
		const fields: Record<string, string> = { circulationTimeH: '4', depthM: '2450' };
		[4, 8, 16].forEach((dt, i) => {
			fields[`bhtShutInH${i}`] = String(dt);
			fields[`bhtTemperatureC${i}`] = String(120 - 10 * Math.log((4 + dt) / dt));
		});
		expect((await post(contributor, 'bht', fields)).status).toBe(200);
		const [c] = await db
			.select()
			.from(siteComputation)
			.where(and(eq(siteComputation.siteId, siteId), eq(siteComputation.kind, 'horner_bht')));
		expect(c.inputs).toMatchObject({ circulationTimeH: 4, depthM: 2450 });
		expect((c.inputs as { readings: unknown[] }).readings).toHaveLength(3);
		expect((c.result as { formationTemperatureC: number }).formationTemperatureC).toBeCloseTo(
			120,
			9
		);
		expect(c.engineVersion).toMatch(/^thermalith /);
	});

	it('heat production from U, Th, K and density (Rybach 1988: 1.88244 µW/m³)', async () => {
		const res = await post(contributor, 'heatProduction', {
			uraniumPpm: '3',
			thoriumPpm: '12',
			potassiumPct: '3',
			densityKgM3: '2700'
		});
		expect(res.status).toBe(200);
		const [c] = await db
			.select()
			.from(siteComputation)
			.where(and(eq(siteComputation.siteId, siteId), eq(siteComputation.kind, 'heat_production')));
		expect(c.inputs).toEqual({ uraniumPpm: 3, thoriumPpm: 12, potassiumPct: 3, densityKgM3: 2700 });
		expect((c.result as { heatProductionUWm3: number }).heatProductionUWm3).toBeCloseTo(1.88244, 9);
	});

	it('palaeoclimate correction stores the steps and a corrected log beside the measured one', async () => {
		const before = await counts();
		const res = await post(contributor, 'palaeoclimate', {
			logId,
			diffusivity: '1',
			stepC0: '2',
			stepAgeYears0: '10000'
		});
		expect(res.status).toBe(200);
		const after = await counts();
		expect(after.logs).toBe(before.logs + 1);
		expect(after.computations).toBe(before.computations + 1);
		const [c] = await db
			.select()
			.from(siteComputation)
			.where(and(eq(siteComputation.siteId, siteId), eq(siteComputation.kind, 'palaeoclimate')));
		expect(c.inputs).toMatchObject({
			logId,
			diffusivityM2s: 1e-6,
			steps: [{ stepC: 2, ageYears: 10000 }]
		});
		const correctedId = (c.result as { correctedLogId: string }).correctedLogId;
		const [corrected] = await db
			.select()
			.from(temperatureLog)
			.where(eq(temperatureLog.id, correctedId));
		expect(corrected.name).toBe('SV-log.csv (palaeoclimate-corrected)');
		// A warming makes the ground warmer than its undisturbed geotherm: the corrected log is cooler.
		corrected.temperatureC.forEach((t, i) => expect(t).toBeLessThan(temperatureC[i]));
	});

	it('bad input gets a message next to its field and stores nothing', async () => {
		const before = await counts();
		const res = await post(contributor, 'bht', {
			circulationTimeH: '4',
			bhtTemperatureC0: '90',
			bhtShutInH0: '0'
		});
		expect(res.status).toBe(400);
		const html = await res.text();
		expect(html).toContain('The time must be more than 0 h.');
		expect(html).toMatch(/id="field-bhtShutInH0-error"/);
		expect(await counts()).toEqual(before);
	});
});

describe('rights', () => {
	it('a member without the upload right is refused 403 on every action and nothing changes', async () => {
		const before = await counts();
		const siteBefore = await siteRow();
		const [anyRevision] = await db
			.select({ id: siteValueRevision.id })
			.from(siteValueRevision)
			.where(eq(siteValueRevision.siteId, siteId));
		const attempts: [string, Record<string, string>][] = [
			['compute', { logId, method: 'interval', fromM: '100', toM: '600', save: '1' }],
			['choose', { revisionId: anyRevision.id }],
			['correct', { heatFlowMWm2: '1', method: 'other', reason: 'not allowed here' }],
			[
				'bht',
				{
					circulationTimeH: '4',
					bhtTemperatureC0: '90',
					bhtShutInH0: '4',
					bhtTemperatureC1: '95',
					bhtShutInH1: '8'
				}
			],
			['palaeoclimate', { logId, stepC0: '1', stepAgeYears0: '1000' }],
			[
				'heatProduction',
				{ uraniumPpm: '1', thoriumPpm: '1', potassiumPct: '1', densityKgM3: '2700' }
			]
		];
		for (const [action, fields] of attempts) {
			expect((await post(orgViewer, action, fields)).status, action).toBe(403);
		}
		expect(await counts()).toEqual(before);
		expect(await siteRow()).toEqual(siteBefore);
	});
});
