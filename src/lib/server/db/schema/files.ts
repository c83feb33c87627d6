import {
	bigint,
	index,
	integer,
	json,
	jsonb,
	pgEnum,
	pgTable,
	text,
	timestamp,
	uuid
} from 'drizzle-orm/pg-core';
import type { ImportSettings, RowEdits } from '../../../schemas/imports';
import { user } from './auth';
import { dataset } from './datasets';
import { site } from './sites';

export const attachmentStatus = pgEnum('attachment_status', ['pending', 'ready']);

/**
 * A file in the object store belonging to a dataset (and optionally one of its sites). It is
 * 'pending' from its announcement until the app has received, checked and stored its bytes;
 * once 'ready' its content is never replaced (`objectKey` is set to the checked object then).
 */
export const attachment = pgTable(
	'attachment',
	{
		id: uuid().primaryKey().defaultRandom(),
		datasetId: uuid()
			.notNull()
			.references(() => dataset.id, { onDelete: 'cascade' }),
		siteId: uuid().references(() => site.id, { onDelete: 'cascade' }),
		objectKey: text().notNull().unique(),
		thumbnailKey: text(),
		fileName: text().notNull(),
		/** Sniffed from the bytes by the server, never taken from the browser. */
		contentType: text(),
		sizeBytes: bigint({ mode: 'number' }),
		sha256: text(),
		status: attachmentStatus().notNull().default('pending'),
		uploadedBy: text().references(() => user.id, { onDelete: 'set null' }),
		uploadedAt: timestamp({ withTimezone: true }).notNull().defaultNow()
	},
	(t) => [
		index('attachment_dataset_idx').on(t.datasetId),
		index('attachment_site_idx').on(t.siteId)
	]
);

/**
 * draft: uploaded and parsed, being previewed and fixed; queued: committed, waiting for a worker;
 * running: a worker is writing its sites (one transaction); done / failed: finished.
 */
// The same list as IMPORT_STATUSES in src/lib/schemas/imports.ts (the API's wire shape).
export const importStatus = pgEnum('import_status', [
	'draft',
	'queued',
	'running',
	'done',
	'failed'
]);

/**
 * One table import into a dataset: the uploaded file (an attachment, kept as provenance), the
 * table parsed from it once, the contributor's settings, corrections and exclusions, the preview
 * shown, the sites to write, progress while running and its history afterwards.
 */
export const importBatch = pgTable(
	'import_batch',
	{
		id: uuid().primaryKey().defaultRandom(),
		datasetId: uuid()
			.notNull()
			.references(() => dataset.id, { onDelete: 'cascade' }),
		fileName: text().notNull(),
		/** SHA-256 of the uploaded file, to notice the same file imported twice. */
		fileSha256: text().notNull(),
		totalRows: bigint({ mode: 'number' }).notNull(),
		doneRows: bigint({ mode: 'number' }).notNull().default(0),
		status: importStatus().notNull().default('running'),
		error: text(),
		/** The original file, kept with the dataset. */
		attachmentId: uuid().references(() => attachment.id, { onDelete: 'set null' }),
		/** The table as the server parsed it (`encodeTable`, dates tagged); json, not jsonb: fast and NUL-safe. */
		parsedTable: json(),
		/** Mapping, CRS, volcanic area, near-duplicate distance of the last preview. */
		settings: jsonb().$type<ImportSettings>(),
		/** Corrected cells and excluded rows of the last preview, as recorded. */
		edits: jsonb().$type<RowEdits>().notNull().default({ corrections: [], excluded: [] }),
		/** The preview the contributor last saw (wire shape, see `$lib/schemas/imports`). */
		preview: json(),
		/** The sites a commit writes: set by a preview without errors, cleared when done. */
		sites: json(),
		/** Incremented by each preview: a commit names the revision it confirms. */
		revision: integer().notNull().default(0),
		/** How many times a worker took the batch (a retry after a crash counts). */
		attempts: integer().notNull().default(0),
		/** Written by the worker with each chunk: a stale heartbeat means its process died. */
		heartbeatAt: timestamp({ withTimezone: true }),
		createdBy: text().references(() => user.id, { onDelete: 'set null' }),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
		finishedAt: timestamp({ withTimezone: true })
	},
	(t) => [index('import_batch_dataset_idx').on(t.datasetId, t.fileSha256)]
);
