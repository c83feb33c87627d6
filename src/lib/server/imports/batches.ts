import { GetObjectCommand } from '@aws-sdk/client-s3';
import { error } from '@sveltejs/kit';
import { and, desc, eq, sql } from 'drizzle-orm';
import {
	applyEdits,
	buildPreview,
	controlCharacter,
	decodeTable,
	displayValues,
	encodeTable,
	ImportFormatError,
	issuesToCsv,
	parseTableFile,
	PREVIEW_COLUMNS,
	suggestMapping,
	cellText,
	type ColumnMapping,
	type ImportPreview,
	type JsonTable,
	type ParsedTable,
	type SiteDraft
} from '$lib/imports';
import { flagsOf } from '$lib/sites/flags';
import type {
	PreviewResponse,
	RowEdits,
	UploadedTable,
	ImportSettings
} from '$lib/schemas/imports';
import { notFound, type Viewer } from '../access';
import type { Db } from '../db/client';
import { importBatch } from '../db/schema';
import { requireUpload } from '../guards';
import { readyAttachmentForViewer } from '../repositories/attachments';
import { datasetForViewer } from '../repositories/datasets';
import { bucket, s3 } from '../storage';
import { markExistingCodes } from './existing-codes';
import { nearbyExistingSites } from './near-existing';

/** Largest table one import accepts; bigger files should be split (the message says so). */
export const MAX_IMPORT_ROWS = 100_000;
const ISSUES_SHOWN = 2000;
const FIRST_ROWS_SHOWN = 25;
const BLOCKED_ROWS_SHOWN = 500;

/** The upload right on the dataset, checked on every step (rights may change between steps). */
export async function requireUploadRight(db: Db, viewer: Viewer, datasetId: string) {
	const found = await datasetForViewer(db, viewer, datasetId);
	requireUpload(found);
	return found;
}

/** A batch's own fields, without the large ones (the table, the sites), which are read when needed. */
const batchFields = {
	id: importBatch.id,
	datasetId: importBatch.datasetId,
	fileName: importBatch.fileName,
	fileSha256: importBatch.fileSha256,
	status: importBatch.status,
	revision: importBatch.revision,
	preview: importBatch.preview,
	createdBy: importBatch.createdBy,
	hasSites: sql<boolean>`${importBatch.sites} IS NOT NULL`
};

async function selectBatch(db: Db, id: string) {
	const [batch] = await db.select(batchFields).from(importBatch).where(eq(importBatch.id, id));
	return batch;
}

export type ChangeableBatch = NonNullable<Awaited<ReturnType<typeof selectBatch>>>;

/**
 * A batch its creator may still work on: anyone else (and an unknown id) gets the same 404, and
 * the upload right on its dataset is checked again.
 */
export async function batchForChange(db: Db, viewer: Viewer, id: string): Promise<ChangeableBatch> {
	const batch = await selectBatch(db, id);
	if (!batch || !viewer.userId || batch.createdBy !== viewer.userId) notFound();
	await requireUploadRight(db, viewer, batch.datasetId);
	return batch;
}

async function readObject(key: string): Promise<Uint8Array> {
	const res = await s3()
		.send(new GetObjectCommand({ Bucket: bucket(), Key: key }))
		.catch((err) => {
			console.error('import: reading the uploaded file from the object store failed', err);
			error(503, 'The file store could not be reached; try again.');
		});
	return res.Body!.transformToByteArray();
}

/**
 * Start an import from a file uploaded as an attachment of the dataset (kept there as the
 * import's provenance): the server reads and parses it once and keeps the parsed table with a
 * new draft batch. Nothing is written to the dataset's sites.
 */
export async function startImport(
	db: Db,
	viewer: Viewer,
	datasetId: string,
	attachmentId: string
): Promise<UploadedTable> {
	await requireUploadRight(db, viewer, datasetId);
	const file = await readyAttachmentForViewer(db, viewer, attachmentId);
	if (file.datasetId !== datasetId) notFound();
	const bytes = await readObject(file.objectKey);
	return draftFromBytes(
		db,
		{
			datasetId,
			attachmentId: file.id,
			fileName: file.fileName,
			sha256: file.sha256 ?? '',
			createdBy: viewer.userId
		},
		bytes
	);
}

/** Parse a file's bytes once and keep the table with a new draft batch (also used by the benchmark). */
export async function draftFromBytes(
	db: Db,
	file: {
		datasetId: string;
		attachmentId: string | null;
		fileName: string;
		sha256: string;
		createdBy: string | null;
	},
	bytes: Uint8Array
): Promise<UploadedTable> {
	let table: ParsedTable;
	try {
		table = await parseTableFile(
			file.fileName,
			bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer
		);
	} catch (err) {
		if (err instanceof ImportFormatError) error(400, `The file could not be read: ${err.message}`);
		if (err instanceof RangeError || err instanceof TypeError)
			error(400, `The file could not be read: ${err.message}`);
		throw err;
	}
	if (table.rows.length > MAX_IMPORT_ROWS)
		error(
			400,
			`The file has ${table.rows.length.toLocaleString('en')} rows; at most ${MAX_IMPORT_ROWS.toLocaleString('en')} rows per import. Split the file.`
		);
	const badHeader = table.headers.findIndex((h) => controlCharacter(h) !== null);
	if (badHeader >= 0)
		error(
			400,
			`Column ${badHeader + 1}'s name contains the control character ${controlCharacter(table.headers[badHeader])}; remove it from the file.`
		);
	const [batch] = await db
		.insert(importBatch)
		.values({
			datasetId: file.datasetId,
			attachmentId: file.attachmentId,
			fileName: file.fileName,
			fileSha256: file.sha256,
			totalRows: table.rows.length,
			status: 'draft',
			parsedTable: encodeTable(table),
			createdBy: file.createdBy
		})
		.returning({ id: importBatch.id });
	return {
		batchId: batch.id,
		fileName: file.fileName,
		format: table.source.format,
		delimiter: table.source.delimiter,
		sheet: table.source.sheet,
		headers: table.headers,
		rowCount: table.rows.length,
		rowKind: table.rowKind,
		suggested: suggestMapping(table.headers)
	};
}

/** Adds "close to an existing site" warnings (the viewer's visible sites) to a built preview. */
async function addNearExisting(
	db: Db,
	viewer: Viewer,
	preview: ImportPreview,
	distanceM: number,
	where: string
) {
	const located = preview.rows.filter((r) => r.site);
	if (located.length === 0 || distanceM <= 0) return;
	const near = await nearbyExistingSites(
		db,
		viewer,
		located.map((r) => r.site!.location),
		distanceM
	);
	if (near.size === 0) return;
	for (const r of located) {
		const site = r.site!;
		const message = near.get(`${site.location.lon},${site.location.lat}`);
		if (!message) continue;
		const issue = {
			row: r.row,
			siteCode: site.code,
			severity: 'warning' as const,
			column: 'Coordinates',
			value: `${site.location.lat}, ${site.location.lon}`,
			code: 'location.near-existing',
			message: `${where} ${r.row} (site ${site.code}): the site at ${site.location.lat.toFixed(5)}, ${site.location.lon.toFixed(5)} is ${message}`
		};
		r.warnings.push(issue);
		preview.issues.push(issue);
		preview.warningCount += 1;
		site.flags = flagsOf(r.warnings);
	}
	const rank = (i: { row: number | null; severity: string }) =>
		(i.row ?? 0) * 2 + (i.severity === 'error' ? 0 : 1);
	preview.issues.sort((a, b) => rank(a) - rank(b));
}

/**
 * The preview of a draft with the contributor's settings and edits: every check of the library,
 * plus the ones only the server can make (visible sites nearby, codes already in the dataset, the
 * same file imported before). Kept with the batch, with the sites a commit would write when
 * nothing blocks; each preview gets a new revision, which a commit must name.
 */
export async function previewImport(
	db: Db,
	viewer: Viewer,
	batch: ChangeableBatch,
	settings: ImportSettings,
	edits: RowEdits
): Promise<PreviewResponse> {
	if (batch.status !== 'draft' && batch.status !== 'failed')
		error(409, `This import is ${batch.status}; it can no longer be changed.`);
	return previewBatchAs(db, viewer, batch, settings, edits);
}

/** The preview of a batch row as `viewer` sees the existing sites; stores it with the batch. */
export async function previewBatchAs(
	db: Db,
	viewer: Viewer,
	batch: ChangeableBatch,
	settings: ImportSettings,
	edits: RowEdits
): Promise<PreviewResponse> {
	const batchId = batch.id;
	const [{ parsedTable }] = await db
		.select({ parsedTable: importBatch.parsedTable })
		.from(importBatch)
		.where(eq(importBatch.id, batchId));
	const table = decodeTable(parsedTable as JsonTable);
	const edited = applyEdits(table, edits);
	if (edited.unknown.length)
		error(400, `The preview is out of date: ${edited.unknown.join('; ')}.`);
	const mapping = settings.mapping as ColumnMapping;
	const preview = buildPreview(edited.table, {
		mapping,
		epsg: settings.epsg,
		volcanicArea: settings.volcanicArea,
		nearDistanceM: settings.nearDistanceM
	});
	const where = table.rowKind === 'feature' ? 'Feature' : 'Row';
	await addNearExisting(db, viewer, preview, settings.nearDistanceM, where);
	const codeColumn = table.headers[mapping.code?.column ?? -1] ?? 'code';
	await markExistingCodes(db, batch.datasetId, preview, codeColumn);
	const [previous] = await db
		.select({ at: importBatch.createdAt, rows: importBatch.totalRows })
		.from(importBatch)
		.where(
			and(
				eq(importBatch.datasetId, batch.datasetId),
				eq(importBatch.fileSha256, batch.fileSha256),
				eq(importBatch.status, 'done')
			)
		)
		.orderBy(desc(importBatch.createdAt))
		.limit(1);

	const revision = batch.revision + 1;
	const response = previewView(
		batchId,
		revision,
		batch.fileName,
		edited,
		preview,
		previous ?? null
	);
	const sites: SiteDraft[] | null = response.canImport ? preview.rows.map((r) => r.site!) : null;
	await db
		.update(importBatch)
		.set({
			status: 'draft',
			error: null,
			settings,
			edits: { corrections: edited.corrections, excluded: edited.excluded },
			preview: response,
			sites,
			revision,
			totalRows: sites?.length ?? preview.validCount
		})
		.where(eq(importBatch.id, batchId));
	return response;
}

function previewView(
	batchId: string,
	revision: number,
	fileName: string,
	edited: ReturnType<typeof applyEdits>,
	preview: ImportPreview,
	previous: { at: Date; rows: number } | null
): PreviewResponse {
	const headers = edited.table.headers;
	const blocked = preview.rows.filter((r) => !r.site);
	const shown = new Set<number>();
	preview.rows.slice(0, FIRST_ROWS_SHOWN).forEach((r) => shown.add(r.row));
	blocked.slice(0, BLOCKED_ROWS_SHOWN).forEach((r) => shown.add(r.row));
	const indexOfRow = new Map(edited.table.sourceRowNumbers.map((r, i) => [r, i]));
	const rows = preview.rows
		.filter((r) => shown.has(r.row))
		.map((r) => ({
			row: r.row,
			code: r.values.code ?? null,
			status: r.site ? ('stored' as const) : ('blocked' as const),
			values: displayValues(r.site ?? r.values),
			cells: r.site ? null : edited.table.rows[indexOfRow.get(r.row)!].map((c) => cellText(c)),
			warnings: r.warnings.length,
			flags: r.site?.flags ?? []
		}));
	const canImport = preview.canImport && preview.validCount > 0;
	return {
		batchId,
		revision,
		fileName,
		headers,
		totalRows: edited.table.rows.length + edited.excluded.length,
		validCount: preview.validCount,
		blockedCount: blocked.length,
		excludedCount: edited.excluded.length,
		errorCount: preview.errorCount,
		warningCount: preview.warningCount,
		canImport,
		ignoredColumns: preview.ignoredColumns,
		issues: preview.issues.slice(0, ISSUES_SHOWN).map((i) => {
			const columnIndex = headers.indexOf(i.column);
			return {
				row: i.row,
				siteCode: i.siteCode ?? null,
				severity: i.severity,
				column: i.column,
				columnIndex: columnIndex >= 0 ? columnIndex : null,
				code: i.code,
				message: i.message
			};
		}),
		issuesTruncated: preview.issues.length > ISSUES_SHOWN,
		columns: PREVIEW_COLUMNS,
		rows,
		rowsTruncated: preview.rows.length > rows.length,
		reportCsv: issuesToCsv(preview.issues),
		previousImport: previous ? { at: previous.at.toISOString(), rows: previous.rows } : null,
		edits: { corrections: edited.corrections, excluded: edited.excluded }
	};
}

/**
 * Commit a previewed draft: exactly the sites of the preview revision the contributor confirmed
 * are queued for writing (all or none, by the worker). Returns the batch id to follow.
 */
export async function commitImport(
	db: Db,
	batch: ChangeableBatch,
	request: { revision: number; allowReimport: boolean },
	enqueue: (batchId: string) => Promise<void>
) {
	const batchId = batch.id;
	if (batch.status !== 'draft') error(409, `This import is ${batch.status} already.`);
	if (batch.revision !== request.revision)
		error(409, 'The preview changed meanwhile (another tab?); check the rows again.');
	if (!batch.hasSites)
		error(
			400,
			'Some rows still have errors: correct or exclude them in the preview, then import. Nothing was written.'
		);
	const previous = (batch.preview as PreviewResponse | null)?.previousImport;
	if (previous && !request.allowReimport)
		error(
			409,
			`This file was imported into this dataset on ${previous.at.slice(0, 10)}. Confirm to import it again.`
		);
	const [queued] = await db
		.update(importBatch)
		.set({ status: 'queued', doneRows: 0 })
		.where(
			and(
				eq(importBatch.id, batchId),
				eq(importBatch.status, 'draft'),
				eq(importBatch.revision, request.revision)
			)
		)
		.returning({ id: importBatch.id, totalRows: importBatch.totalRows });
	if (!queued) error(409, 'The import was committed or changed meanwhile.');
	try {
		await enqueue(batchId);
	} catch (err) {
		console.error(`[import ${batchId}] could not be queued`, err);
		await db.update(importBatch).set({ status: 'draft' }).where(eq(importBatch.id, batchId));
		error(503, 'The job queue could not be reached; nothing was written. Try again.');
	}
	return { batchId, rows: queued.totalRows };
}
