import { z } from 'zod';
import { FIELDS, type FieldKey } from '../imports/fields';
import { DEFAULT_NEAR_DISTANCE_M } from '../imports/near-duplicates';

/*
 * The import API's wire shapes, defined once: the server parses requests with these schemas and
 * the wizard uses the inferred types (and may parse answers with them). Row numbers are the ones
 * the user sees (header = row 1).
 */

const NUL = '\u0000';
const FIELD_KEYS = FIELDS.map((f) => f.key) as [FieldKey, ...FieldKey[]];

export const columnChoiceSchema = z.object({
	column: z.number().int().min(0).max(499),
	unit: z.string().max(40).optional()
});

/** Which column feeds which field (the wizard's mapping step). */
export const mappingSchema = z.partialRecord(z.enum(FIELD_KEYS), columnChoiceSchema);

/** Everything besides the file that decides a preview. */
export const importSettingsSchema = z.object({
	mapping: mappingSchema,
	epsg: z.number().int().positive().default(4326),
	volcanicArea: z.boolean().default(false),
	/** Two sites closer than this (m) are reported as possibly the same borehole; 0 turns it off. */
	nearDistanceM: z.number().min(0).max(10_000).default(DEFAULT_NEAR_DISTANCE_M)
});
export type ImportSettings = z.infer<typeof importSettingsSchema>;

export const cellCorrectionSchema = z.object({
	row: z.number().int().min(1),
	column: z.number().int().min(0),
	value: z
		.string()
		.max(1000)
		.refine((v) => !v.includes(NUL), 'a corrected value cannot contain a NUL character')
});

export type CellCorrection = z.infer<typeof cellCorrectionSchema>;

/** The contributor's own fixes in the preview. */
export const rowEditsSchema = z.object({
	corrections: z.array(cellCorrectionSchema).max(5000).default([]),
	excluded: z.array(z.number().int().min(1)).max(100_000).default([])
});
export type RowEdits = z.infer<typeof rowEditsSchema>;

/** POST /api/v1/datasets/{id}/imports: start an import from an uploaded file (an attachment). */
export const startImportSchema = z.object({
	attachmentId: z.uuid('attachmentId must be a file id')
});

/** POST /api/v1/imports/{id}/preview */
export const previewRequestSchema = importSettingsSchema.extend({
	edits: rowEditsSchema.default({ corrections: [], excluded: [] })
});
export type PreviewRequest = z.input<typeof previewRequestSchema>;

/** POST /api/v1/imports/{id}/commit: the preview revision the contributor confirms. */
export const commitRequestSchema = z.object({
	revision: z.number().int().min(1),
	allowReimport: z.boolean().default(false)
});

/** Answer to the start: the parsed file and a suggested mapping. */
export const uploadedTableSchema = z.object({
	batchId: z.uuid(),
	fileName: z.string(),
	format: z.enum(['csv', 'xlsx', 'geojson']),
	delimiter: z.string().optional(),
	sheet: z.string().optional(),
	headers: z.array(z.string()),
	rowCount: z.number().int(),
	rowKind: z.enum(['row', 'feature']),
	suggested: mappingSchema
});
export type UploadedTable = z.infer<typeof uploadedTableSchema>;

export const issueViewSchema = z.object({
	row: z.number().int().nullable(),
	siteCode: z.string().nullable(),
	severity: z.enum(['error', 'warning']),
	column: z.string(),
	/** Index of the user's column the issue is about, when one cell can fix it. */
	columnIndex: z.number().int().nullable(),
	code: z.string(),
	message: z.string()
});
export type IssueView = z.infer<typeof issueViewSchema>;

/** One row of the preview table: display values (rounded, with the column's unit in its label). */
export const previewRowSchema = z.object({
	row: z.number().int(),
	code: z.string().nullable(),
	/** stored: will be written; blocked: has an error, will not be written until fixed or excluded. */
	status: z.enum(['stored', 'blocked']),
	values: z.record(z.string(), z.string()),
	/** The row's cells as in the file (after corrections), for fixing a blocked row. */
	cells: z.array(z.string()).nullable(),
	warnings: z.number().int(),
	flags: z.array(z.string())
});
export type PreviewRow = z.infer<typeof previewRowSchema>;

export const previewResponseSchema = z.object({
	batchId: z.uuid(),
	revision: z.number().int(),
	fileName: z.string(),
	headers: z.array(z.string()),
	totalRows: z.number().int(),
	validCount: z.number().int(),
	blockedCount: z.number().int(),
	excludedCount: z.number().int(),
	errorCount: z.number().int(),
	warningCount: z.number().int(),
	canImport: z.boolean(),
	ignoredColumns: z.array(z.string()),
	issues: z.array(issueViewSchema),
	issuesTruncated: z.boolean(),
	columns: z.array(z.object({ key: z.string(), label: z.string() })),
	rows: z.array(previewRowSchema),
	rowsTruncated: z.boolean(),
	reportCsv: z.string(),
	previousImport: z.object({ at: z.string(), rows: z.number() }).nullable(),
	edits: z.object({
		corrections: z.array(
			cellCorrectionSchema.extend({
				header: z.string(),
				was: z.union([z.string(), z.number(), z.boolean(), z.null()])
			})
		),
		excluded: z.array(z.number().int())
	})
});
export type PreviewResponse = z.infer<typeof previewResponseSchema>;

export const IMPORT_STATUSES = ['draft', 'queued', 'running', 'done', 'failed'] as const;

/** GET /api/v1/imports/{id}: progress and final state. */
export const batchStatusSchema = z.object({
	id: z.uuid(),
	datasetId: z.uuid(),
	status: z.enum(IMPORT_STATUSES),
	totalRows: z.number().int(),
	doneRows: z.number().int(),
	error: z.string().nullable()
});
export type BatchStatus = z.infer<typeof batchStatusSchema>;
