import { z } from 'zod';
import { LICENCE_IDS } from '$lib/licences';

const DOI = /^10\.\d{4,9}\/\S+$/;

export const datasetSchema = z
	.object({
		title: z.string().trim().min(5, 'Give the dataset a title of at least 5 characters.').max(300),
		abstract: z.string().trim().max(5000, 'Keep the abstract under 5,000 characters.').default(''),
		keywords: z
			.string()
			.default('')
			.transform((v) =>
				v
					.split(',')
					.map((k) => k.trim())
					.filter(Boolean)
			)
			.refine((k) => k.length <= 20, 'Use at most 20 keywords.'),
		licence: z.enum(LICENCE_IDS, { message: 'Choose a licence from the list.' }),
		authors: z.string().trim().max(1000, 'Keep the authors under 1,000 characters.').default(''),
		citation: z.string().trim().max(1000).default(''),
		doi: z
			.string()
			.trim()
			.transform((v) => v.replace(/^https?:\/\/(dx\.)?doi\.org\//, ''))
			.refine((v) => v === '' || DOI.test(v), 'A DOI looks like 10.1234/abcd.5678.')
			.transform((v) => (v === '' ? null : v)),
		visibility: z.enum(['public', 'embargoed', 'restricted', 'private'], {
			message: 'Choose who may see the dataset.'
		}),
		embargoUntil: z
			.string()
			.trim()
			.transform((v) => (v === '' ? null : v))
			.refine((v) => v === null || /^\d{4}-\d{2}-\d{2}$/.test(v), 'Enter the date as YYYY-MM-DD.')
	})
	.refine((d) => d.visibility !== 'embargoed' || d.embargoUntil !== null, {
		path: ['embargoUntil'],
		message: 'An embargoed dataset needs the date it becomes public.'
	});

export const newDatasetSchema = z.intersection(
	datasetSchema,
	z.object({ organisationId: z.string().min(1, 'Choose the organisation that publishes it.') })
);

/** The comment of a lifecycle transition; required to return a dataset (checked by the server). */
export const transitionSchema = z.object({
	comment: z
		.string()
		.trim()
		.max(2000, 'Keep the comment under 2,000 characters.')
		.default('')
		.transform((v) => (v === '' ? null : v))
});
