import { z } from 'zod';

/** Largest table one import accepts; bigger files should be split (the preview says so). */
export const MAX_IMPORT_ROWS = 100_000;

const cell = z.union([z.string(), z.number(), z.boolean(), z.null()]);

/**
 * What the upload wizard sends: the table as the browser parsed it with $lib/imports, the column
 * mapping and CRS the user confirmed, and the file's SHA-256. The server validates every row again
 * with the same library, so nothing the browser decided is trusted.
 */
export const importPayloadSchema = z.object({
	fileName: z.string().trim().min(1).max(255),
	sha256: z.string().regex(/^[0-9a-f]{64}$/, 'sha256 must be 64 hex digits'),
	table: z.object({
		headers: z.array(z.string()).min(1, 'the table has no columns').max(500),
		rows: z
			.array(z.array(cell))
			.max(
				MAX_IMPORT_ROWS,
				`at most ${MAX_IMPORT_ROWS.toLocaleString('en')} rows per import; split the file`
			),
		sourceRowNumbers: z.array(z.number().int()),
		rowKind: z.enum(['row', 'feature']),
		decimalComma: z.boolean(),
		source: z.object({
			format: z.enum(['csv', 'xlsx', 'geojson']),
			delimiter: z.string().optional(),
			sheet: z.string().optional()
		})
	}),
	mapping: z.record(
		z.string(),
		z.object({ column: z.number().int().min(0), unit: z.string().optional() }).passthrough()
	),
	epsg: z.number().int().positive().optional(),
	volcanicArea: z.boolean().optional(),
	/** Set when the user confirmed importing a file that was imported into this dataset before. */
	allowReimport: z.boolean().optional()
});

export type ImportPayload = z.infer<typeof importPayloadSchema>;
