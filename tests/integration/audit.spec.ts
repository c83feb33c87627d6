import { randomUUID } from 'node:crypto';
import Papa from 'papaparse';
import { eq, inArray } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb } from '../../src/lib/server/db/client';
import { auditEvent, member, user } from '../../src/lib/server/db/schema';
import { testEnv } from './env';
import { createDraftDataset, gridCsv, importFile, waitForImport } from './fixtures';
import { Client, DEMO_PASSWORD, signIn } from './http';

/*
 * The audit log: a row for every action done through the product, and the audit page and its
 * CSV export for curators (their organisations) and administrators (everything) only.
 */
const { db, client: sql } = createDb(testEnv.databaseUrl(), { max: 2 });
const ORG = 'org-korvald-survey';
const run = Date.now().toString(36);
const EMAIL = {
	outsider: 'owner@lindmark-thermics.example',
	orgViewer: 'viewer@korvald-survey.example',
	contributor: 'contributor@korvald-survey.example',
	curator: 'curator@korvald-survey.example',
	owner: 'owner@korvald-survey.example',
	platformAdmin: 'admin@thermalith.example'
} as const;
type Kind = 'anonymous' | keyof typeof EMAIL;
const kinds: Kind[] = ['anonymous', ...(Object.keys(EMAIL) as (keyof typeof EMAIL)[])];
const c = {} as Record<Kind, Client>;
let bystanderId = '';
let throwAwayMemberId = '';
let korvaldDataset = '';
let lindmarkDataset = '';

beforeAll(async () => {
	c.anonymous = new Client();
	for (const [k, email] of Object.entries(EMAIL)) c[k as Kind] = await signIn(email, DEMO_PASSWORD);
	bystanderId = randomUUID();
	await db
		.insert(user)
		.values({ id: bystanderId, name: 'Audit Bystander', email: `${bystanderId}@example.test` });
	const memberUser = randomUUID();
	await db
		.insert(user)
		.values({ id: memberUser, name: 'Audit Member', email: `${memberUser}@example.test` });
	throwAwayMemberId = randomUUID();
	await db
		.insert(member)
		.values({ id: throwAwayMemberId, organizationId: ORG, userId: memberUser, role: 'viewer' });
	// A formula in the title must reach the export neutralised.
	korvaldDataset = await createDraftDataset(c.contributor, `=HYPERLINK("x") audit ${run}`);
	const res = await c.outsider.post('/datasets/new', {
		organisationId: 'org-lindmark-thermics',
		title: `Lindmark audit ${run}`,
		licence: 'CC-BY-4.0',
		visibility: 'private',
		embargoUntil: '',
		doi: ''
	});
	expect(res.status).toBe(303);
	lindmarkDataset = res.headers.get('location')!.split('/').pop()!;
});
afterAll(async () => {
	await sql.end();
});

const rowsFor = (where: ReturnType<typeof eq>) => db.select().from(auditEvent).where(where);

describe('audit rows', () => {
	it('records every action done through the product, with who did it', async () => {
		const id = korvaldDataset;
		const ok = (res: Response, status = 200) => expect(res.status).toBe(status);
		ok(
			await c.contributor.post(`/datasets/${id}?/update`, {
				title: `=HYPERLINK("x") audit ${run}`,
				abstract: 'Edited.',
				licence: 'CC-BY-4.0',
				visibility: 'private',
				embargoUntil: '',
				doi: ''
			})
		);
		const announced = await c.contributor.json('/api/v1/attachments', {
			datasetId: id,
			fileName: 'notes.csv',
			sizeBytes: 8
		});
		ok(announced, 201);
		const { uploadUrl } = await announced.json();
		ok(await c.contributor.put(uploadUrl, Buffer.from('a,b\n1,2\n')));
		const batchId = await importFile(
			c.contributor,
			id,
			`audit-${run}.csv`,
			gridCsv(3, `AU-${run}`, { lon: -20, lat: -40 })
		);
		expect((await waitForImport(c.contributor, batchId)).status).toBe('done');
		ok(await c.contributor.post(`/datasets/${id}?/submit`, {}));
		ok(await c.curator.post(`/datasets/${id}?/return`, { comment: 'Add the method.' }));
		ok(await c.contributor.post(`/datasets/${id}?/submit`, {}));
		ok(await c.curator.post(`/datasets/${id}?/publish`, {}));
		ok(await c.orgViewer.get(`/datasets/${id}/download/sites.geojson`));
		const corrected = await c.curator.post(`/datasets/${id}?/correct`, {});
		ok(corrected, 303);
		const v2 = corrected.headers.get('location')!.split('?')[0].split('/').pop()!;
		ok(await c.owner.post(`/datasets/${v2}?/delete`, {}), 303);
		ok(await c.owner.post(`/datasets/${id}?/retire`, {}));

		const byDataset = await rowsFor(inArray(auditEvent.datasetId, [id, v2]));
		const seen = byDataset.map((r) => `${r.action} ${r.actorEmail ?? 'nobody'}`).sort();
		expect(seen).toEqual(
			[
				`create ${EMAIL.contributor}`,
				`edit ${EMAIL.contributor}`,
				`upload ${EMAIL.contributor}`,
				// The imported file is kept with the dataset: an upload of its own.
				`upload ${EMAIL.contributor}`,
				`import-start ${EMAIL.contributor}`,
				`import ${EMAIL.contributor}`,
				`submit ${EMAIL.contributor}`,
				`return ${EMAIL.curator}`,
				`submit ${EMAIL.contributor}`,
				`publish ${EMAIL.curator}`,
				`download ${EMAIL.orgViewer}`,
				`version ${EMAIL.curator}`,
				`delete ${EMAIL.owner}`,
				`retire ${EMAIL.owner}`
			].sort()
		);
		for (const r of byDataset) expect(r.organisationId).toBe(ORG);
		expect(
			byDataset
				.filter((r) => r.action === 'upload')
				.map((r) => r.details.fileName)
				.sort()
		).toEqual([`audit-${run}.csv`, 'notes.csv'].sort());
		expect(byDataset.find((r) => r.action === 'import')!.details).toMatchObject({ rows: 3 });
		expect(byDataset.find((r) => r.action === 'import-start')!.details).toMatchObject({
			importId: batchId,
			rows: 3
		});

		ok(
			await c.owner.post(`/organisations/korvald-survey/settings?/changeRole`, {
				memberId: throwAwayMemberId,
				role: 'contributor'
			})
		);
		const [role] = await rowsFor(eq(auditEvent.action, 'role-change')).then((rows) =>
			rows.filter((r) => r.details.memberId === throwAwayMemberId)
		);
		expect(role).toMatchObject({
			actorEmail: EMAIL.owner,
			organisationId: ORG,
			details: { role: 'contributor', name: 'Audit Member' }
		});

		ok(await c.platformAdmin.post('/admin?/suspend', { userId: bystanderId, reason: 'test' }));
		ok(await c.platformAdmin.post('/admin?/restore', { userId: bystanderId }));
		const account = (await rowsFor(inArray(auditEvent.action, ['suspend', 'restore']))).filter(
			(r) => r.details.userId === bystanderId
		);
		expect(account.map((r) => `${r.action} ${r.actorEmail}`).sort()).toEqual([
			`restore ${EMAIL.platformAdmin}`,
			`suspend ${EMAIL.platformAdmin}`
		]);
	});

	it('refused actions leave no row', async () => {
		const before = (await rowsFor(eq(auditEvent.datasetId, lindmarkDataset))).length;
		expect((await c.curator.post(`/datasets/${lindmarkDataset}?/submit`, {})).status).toBe(404);
		expect((await c.orgViewer.post(`/admin?/suspend`, { userId: bystanderId })).status).toBe(403);
		expect((await rowsFor(eq(auditEvent.datasetId, lindmarkDataset))).length).toBe(before);
	});
});

describe('audit page and export', () => {
	/** Whose events each kind reads: null = refused. */
	const READS: Record<Kind, { korvald: boolean; lindmark: boolean } | null> = {
		anonymous: null,
		orgViewer: null,
		contributor: null,
		curator: { korvald: true, lindmark: false },
		owner: { korvald: true, lindmark: false },
		outsider: { korvald: false, lindmark: true },
		platformAdmin: { korvald: true, lindmark: true }
	};

	it.each(kinds)('as %s', async (k) => {
		const pageRes = await c[k].get('/audit');
		const exportRes = await c[k].get('/audit/export.csv');
		const reads = READS[k];
		if (!reads) {
			expect(pageRes.status).toBe(k === 'anonymous' ? 303 : 403);
			expect(exportRes.status).toBe(k === 'anonymous' ? 401 : 403);
			expect(await exportRes.text()).not.toContain(korvaldDataset);
			return;
		}
		expect(pageRes.status).toBe(200);
		expect(exportRes.status).toBe(200);
		expect(exportRes.headers.get('content-type')).toBe('text/csv; charset=utf-8');
		const csv = await exportRes.text();
		expect(csv.includes(korvaldDataset)).toBe(reads.korvald);
		expect(csv.includes(lindmarkDataset)).toBe(reads.lindmark);
		const page = await (await c[k].get(`/audit?dataset=${korvaldDataset}`)).text();
		expect(page.includes(`audit ${run}`)).toBe(reads.korvald);
	});

	it('filters by action, dataset, who and dates, and exports what it shows, neutralised', async () => {
		const q = `dataset=${korvaldDataset}&action=publish`;
		const csv = await (await c.curator.get(`/audit/export.csv?${q}`)).text();
		expect(csv.split('\n')[0]).toMatch(/^# Thermalith audit log exported /);
		const [head, ...rows] = Papa.parse<string[]>(csv.trim(), { comments: '#' }).data;
		expect(rows).toHaveLength(1);
		const at = (h: string) => rows[0][head.indexOf(h)];
		expect(at('action')).toBe('publish');
		expect(at('actor_email')).toBe(EMAIL.curator);
		expect(at('dataset')).toBe(`'=HYPERLINK("x") audit ${run}`);
		expect(JSON.parse(at('details'))).toMatchObject({ from: 'in_review', to: 'published' });

		const byActor = await (
			await c.curator.get(`/audit/export.csv?dataset=${korvaldDataset}&actor=contributor@korvald`)
		).text();
		const actorRows = Papa.parse<string[]>(byActor.trim(), { comments: '#' }).data.slice(1);
		expect(actorRows.length).toBeGreaterThan(3);
		for (const r of actorRows) expect(r[head.indexOf('actor_email')]).toBe(EMAIL.contributor);

		const today = new Date().toISOString().slice(0, 10);
		const tomorrow = new Date(Date.now() + 86_400_000).toISOString().slice(0, 10);
		const count = async (query: string) =>
			Papa.parse<string[]>(
				(await (await c.curator.get(`/audit/export.csv?${query}`)).text()).trim(),
				{ comments: '#' }
			).data.length - 1;
		expect(await count(`dataset=${korvaldDataset}&from=${today}&to=${today}`)).toBeGreaterThan(5);
		expect(await count(`dataset=${korvaldDataset}&from=${tomorrow}`)).toBe(0);
		expect(await count(`dataset=${korvaldDataset}&to=2000-01-01`)).toBe(0);

		const bad = await c.curator.get('/audit/export.csv?from=yesterday');
		expect(bad.status).toBe(400);
		expect(await bad.text()).toContain('YYYY-MM-DD');
		const badPage = await (await c.curator.get('/audit?dataset=not-an-id')).text();
		expect(badPage).toContain('A dataset is given by its id');
	});

	it('pages the log, newest first', async () => {
		const html = await (await c.platformAdmin.get('/audit')).text();
		const total = Number(html.replace(/<!--[^>]*-->/g, '').match(/(\d+) events/)![1]);
		const rows = (html.match(/<tr class="border-b/g) ?? []).length;
		expect(rows).toBe(Math.min(total, 50));
		if (total > 50) expect(html).toContain('?page=2');
		const times = [...html.matchAll(/(\d{4}-\d{2}-\d{2} \d{2}:\d{2}) UTC/g)].map((m) => m[1]);
		expect(times.length).toBeGreaterThan(0);
		expect([...times].sort().reverse()).toEqual(times);
	});

	it('exports are recorded, and the log cannot be changed', async () => {
		const before = (await rowsFor(eq(auditEvent.action, 'audit-export'))).length;
		await c.owner.get('/audit/export.csv?action=publish');
		expect((await rowsFor(eq(auditEvent.action, 'audit-export'))).length).toBe(before + 1);
		await expect(
			db.delete(auditEvent).where(eq(auditEvent.datasetId, korvaldDataset))
		).rejects.toThrow();
	});
});
