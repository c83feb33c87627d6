import { z } from 'zod';
import { isUuid } from '$lib/uuid';

const DAY = /^\d{4}-\d{2}-\d{2}$/;
const day = (what: string) =>
	z
		.string()
		.trim()
		.default('')
		.refine((v) => v === '' || (DAY.test(v) && !Number.isNaN(Date.parse(v))), {
			message: `Enter the ${what} date as YYYY-MM-DD.`
		})
		.transform((v) => (v === '' ? null : v));

/** The audit page's filters (URL query), shared by the page and its CSV export. */
export const auditFilterSchema = z
	.object({
		// Free text in the table; any word-like name is accepted so new actions filter too.
		action: z
			.string()
			.trim()
			.default('')
			.refine((v) => v === '' || /^[a-z][a-z-]{0,39}$/.test(v), 'Choose an action from the list.')
			.transform((v) => (v === '' ? null : v)),
		dataset: z
			.string()
			.trim()
			.default('')
			.refine((v) => v === '' || isUuid(v), 'A dataset is given by its id (from its address).')
			.transform((v) => (v === '' ? null : v)),
		actor: z
			.string()
			.trim()
			.max(200, 'Keep the name or address under 200 characters.')
			.default('')
			.transform((v) => (v === '' ? null : v)),
		from: day('first'),
		to: day('last'),
		page: z.coerce.number().int().min(1).max(100_000).catch(1).default(1)
	})
	.refine((f) => !f.from || !f.to || f.from <= f.to, {
		path: ['to'],
		message: 'The last date comes after the first.'
	});

export type AuditFilter = z.infer<typeof auditFilterSchema>;

export function parseAuditFilter(params: URLSearchParams) {
	return auditFilterSchema.safeParse(Object.fromEntries(params));
}
