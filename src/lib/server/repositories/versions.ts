import { error } from '@sveltejs/kit';
import { and, asc, eq, getTableColumns, isNull, sql } from 'drizzle-orm';
import { toSnakeCase } from 'drizzle-orm/casing';
import { diffVersions, type SiteValues, type VersionDiff } from '$lib/datasets/version-diff';
import type { Viewer } from '../access';
import type { Db } from '../db/client';
import { conductivitySample, dataset, siteComputation, site, temperatureLog } from '../db/schema';
import { recordAudit, type DbOrTx } from './audit';
import { datasetForViewer, type VisibleDataset } from './datasets';

/*
 * Versions: a published dataset is never changed in place. "Correct" opens a new draft version
 * (a copy of its metadata, sites, temperature logs, conductivity samples and site
 * computations; files stay with the version they were uploaded to). Publishing the new version
 * marks the old one superseded (lifecycle.ts); it stays readable and citable.
 */

/** Dataset columns that belong to one version, never copied into the next. */
const PER_VERSION = new Set([
	'id',
	'status',
	'version',
	'previousVersionId',
	'supersededById',
	'publishedAt',
	'createdBy',
	'updatedBy',
	'createdAt',
	'updatedAt'
]);

/** Database column names of a table, without the ones the copy sets itself. */
function copiedColumns(table: Parameters<typeof getTableColumns>[0], skip: string[]): string[] {
	// All columns (also ones added later), so a new site value is never lost in a new version.
	// Names as the client's snake_case casing writes them (db/client.ts), explicit ones as given.
	return Object.entries(getTableColumns(table))
		.filter(([key]) => !skip.includes(key))
		.map(([, c]) => (c.keyAsName ? toSnakeCase(c.name) : c.name));
}

const cols = (names: string[], alias?: string) =>
	sql.join(
		names.map((n) =>
			alias ? sql`${sql.identifier(alias)}.${sql.identifier(n)}` : sql.identifier(n)
		),
		sql`, `
	);

/** Copy sites and everything measured at them from one dataset into another (one transaction). */
async function copySites(tx: DbOrTx, fromId: string, toId: string): Promise<number> {
	// A value revision belongs to its site (site-values.ts): the copy starts with the current values
	// as its own "as submitted" and no revisions, so it never points at the old version's history.
	const siteCols = copiedColumns(site, [
		'id',
		'datasetId',
		'createdAt',
		'updatedAt',
		'currentRevisionId'
	]);
	const copied = await tx.execute(sql`
		INSERT INTO site (dataset_id, ${cols(siteCols)})
		SELECT ${toId}, ${cols(siteCols)} FROM site WHERE dataset_id = ${fromId}`);
	// Old site → new site by code (unique within a dataset).
	const map = sql`SELECT o.id AS old_id, n.id AS new_id FROM site o
		JOIN site n ON n.code = o.code AND n.dataset_id = ${toId} WHERE o.dataset_id = ${fromId}`;
	const sampleCols = copiedColumns(conductivitySample, ['id', 'siteId']);
	await tx.execute(sql`
		WITH m AS (${map})
		INSERT INTO conductivity_sample (site_id, ${cols(sampleCols)})
		SELECT m.new_id, ${cols(sampleCols, 'c')} FROM conductivity_sample c JOIN m ON c.site_id = m.old_id`);
	const logCols = copiedColumns(temperatureLog, ['id', 'siteId']);
	const compCols = copiedColumns(siteComputation, ['id', 'siteId', 'logId']);
	// Logs get their new ids first, so computations keep pointing at the copy of their log.
	await tx.execute(sql`
		WITH m AS (${map}),
		l AS MATERIALIZED (
			SELECT t.id AS old_log, gen_random_uuid() AS new_log, m.new_id AS new_site
			FROM temperature_log t JOIN m ON t.site_id = m.old_id),
		logs AS (
			INSERT INTO temperature_log (id, site_id, ${cols(logCols)})
			SELECT l.new_log, l.new_site, ${cols(logCols, 't')}
			FROM temperature_log t JOIN l ON l.old_log = t.id RETURNING 1)
		INSERT INTO site_computation (site_id, log_id, ${cols(compCols)})
		SELECT m.new_id, l.new_log, ${cols(compCols, 'h')}
		FROM site_computation h JOIN m ON h.site_id = m.old_id
		LEFT JOIN l ON l.old_log = h.log_id`);
	return copied.count ?? 0;
}

/** The draft (or in review, returned) version opened to correct this one, if any. */
async function successorOf(db: Db, datasetId: string) {
	const [next] = await db
		.select({ id: dataset.id, status: dataset.status })
		.from(dataset)
		.where(eq(dataset.previousVersionId, datasetId));
	return next ?? null;
}

function isUniqueViolation(e: unknown): boolean {
	const err = e as { code?: string; cause?: { code?: string } };
	return err?.code === '23505' || err?.cause?.code === '23505';
}

export const CORRECT_REFUSAL =
	'Only the latest published version is corrected, by contributors, curators and owners of its organisation with a confirmed e-mail address. Nothing was changed.';

/**
 * Open a new draft version of a published dataset, or return the one already open (one
 * successor per version: a unique index, so two people correcting at once share one draft).
 */
export async function openCorrection(
	db: Db,
	viewer: Viewer,
	datasetId: string
): Promise<{ id: string; created: boolean }> {
	const found = await datasetForViewer(db, viewer, datasetId);
	if (!found.can.correct) error(403, CORRECT_REFUSAL);
	const open = await successorOf(db, datasetId);
	if (open) return { id: open.id, created: false };
	const d = found.dataset;
	const copied = Object.fromEntries(Object.entries(d).filter(([k]) => !PER_VERSION.has(k))) as Omit<
		typeof d,
		'id'
	>;
	try {
		const id = await db.transaction(async (tx) => {
			const [created] = await tx
				.insert(dataset)
				.values({
					...copied,
					status: 'draft',
					version: d.version + 1,
					previousVersionId: d.id,
					createdBy: viewer.userId,
					updatedBy: viewer.userId
				})
				.returning({ id: dataset.id });
			const sites = await copySites(tx, d.id, created.id);
			await recordAudit(tx, viewer, {
				action: 'version',
				organisationId: d.organisationId,
				datasetId: created.id,
				details: { previousVersionId: d.id, version: d.version + 1, sites }
			});
			return created.id;
		});
		return { id, created: true };
	} catch (e) {
		if (!isUniqueViolation(e)) throw e;
		const other = await successorOf(db, datasetId);
		if (!other) throw e;
		return { id: other.id, created: false };
	}
}

/** Within the publish transaction: the version this one corrects is now superseded by it. */
export async function supersedePrevious(
	tx: DbOrTx,
	published: { id: string; previousVersionId: string | null }
) {
	if (!published.previousVersionId) return;
	await tx
		.update(dataset)
		.set({ supersededById: published.id, updatedAt: new Date() })
		.where(and(eq(dataset.id, published.previousVersionId), isNull(dataset.supersededById)));
}

/** Links between versions, for the dataset page: previous, superseded by, open correction. */
export async function versionLinks(db: Db, viewer: Viewer, found: VisibleDataset) {
	const d = found.dataset;
	const link = async (id: string | null) => {
		if (!id) return null;
		try {
			const v = await datasetForViewer(db, viewer, id);
			return {
				id,
				version: v.dataset.version,
				status: v.dataset.status,
				visibility: v.dataset.visibility
			};
		} catch {
			// Not visible to this viewer (an unpublished draft, say): no link.
			return null;
		}
	};
	const open = found.can.readPrivate ? await successorOf(db, d.id) : null;
	return {
		previous: await link(d.previousVersionId),
		supersededBy: await link(d.supersededById),
		openCorrection: open && open.id !== d.supersededById ? open : null
	};
}

/** Site fields compared between versions: every column but ids and timestamps. */
const COMPARED = Object.keys(getTableColumns(site)).filter(
	(k) => !['id', 'datasetId', 'code', 'createdAt', 'updatedAt'].includes(k)
);

async function sitesOf(db: Db, datasetId: string): Promise<SiteValues[]> {
	return db.select().from(site).where(eq(site.datasetId, datasetId)).orderBy(asc(site.code));
}

/**
 * What this version changes against the one it corrects, for members of the organisation (the
 * curator reads it before publishing); null when there is no previous version or for others.
 */
export async function diffAgainstPrevious(
	db: Db,
	viewer: Viewer,
	found: VisibleDataset
): Promise<(VersionDiff & { previousVersion: number }) | null> {
	const previousId = found.dataset.previousVersionId;
	if (!previousId || !found.can.readPrivate) return null;
	const previous = await datasetForViewer(db, viewer, previousId);
	const [before, after] = await Promise.all([
		sitesOf(db, previousId),
		sitesOf(db, found.dataset.id)
	]);
	return { ...diffVersions(before, after, COMPARED), previousVersion: previous.dataset.version };
}
