import { error } from '@sveltejs/kit';
import { and, desc, eq, sql } from 'drizzle-orm';
import {
	applyEdits,
	buildPreview,
	cellText,
	controlCharacter,
	decodeTable,
	displayValues,
	encodeTable,
	ImportFormatError,
	issuesToCsv,
	parseTableFile,
	PREVIEW_COLUMNS,
	suggestMapping,
	type ColumnMapping,
	type ImportPreview,
	type JsonTable,
	type ParsedTable,
	type SiteDraft
} from '$lib/imports';
import type {
	ImportSettings,
	PreviewResponse,
	RowEdits,
	UploadedTable
} from '$lib/schemas/imports';
import { flagsOf } from '$lib/sites/flags';
import type { Viewer } from '../access';
import type { Db } from '../db/client';
import { importBatch } from '../db/schema';
import { markExistingCodes } from './existing-codes';
import { nearbyExistingSites } from './near-existing';

/*
 * The work of an import's steps that needs no request: parsing a file into a draft batch and
 * previewing a batch. batches.ts adds the access checks and the object store; the benchmark
 * calls these directly (no SvelteKit environment there).
 */

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

export async function selectBatch(db: Db, id: string) {
	const [batch] = await db.select(batchFields).from(importBatch).where(eq(importBatch.id, id));
	return batch;
}

export type ChangeableBatch = NonNullable<Awaited<ReturnType<typeof selectBatch>>>;

/** Largest table one import accepts; bigger files should be split (the message says so). */
export const MAX_IMPORT_ROWS = 100_000;
const ISSUES_SHOWN = 2000;
const FIRST_ROWS_SHOWN = 25;
const BLOCKED_ROWS_SHOWN = 500;

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
