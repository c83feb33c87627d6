import { bigint, index, pgEnum, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
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

export const importStatus = pgEnum('import_status', ['running', 'done', 'failed']);

/** One table import into a dataset: its progress while running and its history afterwards. */
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
		createdBy: text().references(() => user.id, { onDelete: 'set null' }),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
		finishedAt: timestamp({ withTimezone: true })
	},
	(t) => [index('import_batch_dataset_idx').on(t.datasetId, t.fileSha256)]
);
