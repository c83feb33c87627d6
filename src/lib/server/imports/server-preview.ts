import { and, desc, eq } from 'drizzle-orm';
import {
	buildPreview,
	type ColumnMapping,
	type ImportPreview,
	type ParsedTable
} from '$lib/imports';
import type { Viewer } from '../access';
import type { Db } from '../db/client';
import { importBatch } from '../db/schema';
import { markExistingCodes } from './existing-codes';
import { nearbyExistingSites } from './near-existing';
import type { ImportPayload } from './payload';

export interface ServerPreview {
	preview: ImportPreview;
	previousImport: { at: Date; rows: number } | null;
}

/**
 * The authoritative preview: the same row validation as the browser, plus what only the server
 * knows: sites within 100 m of existing ones the user may see, and whether this file was imported
 * into this dataset before.
 */
export async function serverPreview(
	db: Db,
	viewer: Viewer,
	datasetId: string,
	payload: ImportPayload
): Promise<ServerPreview> {
	const table = payload.table as ParsedTable;
	const options = {
		mapping: payload.mapping as ColumnMapping,
		epsg: payload.epsg,
		volcanicArea: payload.volcanicArea
	};
	const first = buildPreview(table, options);
	const located = first.rows.flatMap((r) => (r.site ? [r.site.location] : []));
	const near = located.length
		? await nearbyExistingSites(db, viewer, located)
		: new Map<string, string>();
	const preview = near.size
		? buildPreview(table, {
				...options,
				nearExisting: (s) => near.get(`${s.location.lon},${s.location.lat}`) ?? null
			})
		: first;
	const codeColumn = table.headers[options.mapping.code?.column ?? -1] ?? 'code';
	await markExistingCodes(db, datasetId, preview, codeColumn);
	const [previous] = await db
		.select({ at: importBatch.createdAt, rows: importBatch.totalRows })
		.from(importBatch)
		.where(
			and(
				eq(importBatch.datasetId, datasetId),
				eq(importBatch.fileSha256, payload.sha256),
				eq(importBatch.status, 'done')
			)
		)
		.orderBy(desc(importBatch.createdAt))
		.limit(1);
	return { preview, previousImport: previous ?? null };
}
