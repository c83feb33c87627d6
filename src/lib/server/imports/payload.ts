import { z } from 'zod';

/** Largest table one import accepts; bigger files should be split (the preview says so). */
export const MAX_IMPORT_ROWS = 100_000;

const cell = z.union([z.string(), z.number(), z.boolean(), z.null()]);

const NUL = '\u0000';

/**
 * PostgreSQL text cannot hold a NUL character (a query with one fails as a whole), so a table with
 * one is refused with its position. One plain loop, not a rule per cell: tables have 10^6 cells.
 */
function refuseNul(
	table: {
		headers: string[];
		rows: (string | number | boolean | null)[][];
		sourceRowNumbers: number[];
	},
	ctx: z.RefinementCtx
) {
	const message = 'contains a NUL character, which cannot be stored; remove it from the file';
	const h = table.headers.findIndex((v) => v.includes(NUL));
	if (h >= 0) {
		ctx.addIssue({
			code: 'custom',
			path: ['headers', h],
			message: `Column ${h + 1}'s name ${message}`
		});
		return;
	}
	for (let i = 0; i < table.rows.length; i++) {
		const row = table.rows[i];
		for (let j = 0; j < row.length; j++) {
			const v = row[j];
			if (typeof v === 'string' && v.includes(NUL)) {
				const where = `Row ${table.sourceRowNumbers[i] ?? i + 1}, column "${table.headers[j] ?? j + 1}"`;
				ctx.addIssue({ code: 'custom', path: ['rows', i, j], message: `${where} ${message}` });
				return;
			}
		}
	}
}

/**
 * What the upload wizard sends: the table as the browser parsed it with $lib/imports, the column
 * mapping and CRS the user confirmed, and the file's SHA-256. The server validates every row again
 * with the same library, so nothing the browser decided is trusted.
 */
export const importPayloadSchema = z.object({
	fileName: z
		.string()
		.trim()
		.min(1)
		.max(255)
		.refine((v) => !v.includes(NUL), 'the file name contains a NUL character'),
	sha256: z.string().regex(/^[0-9a-f]{64}$/, 'sha256 must be 64 hex digits'),
	table: z
		.object({
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
		})
		.superRefine(refuseNul),
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
