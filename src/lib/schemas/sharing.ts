import { z } from 'zod';

/** Forms of access requests and grants (dataset page and its catalogue entry). */

const optionalDay = z
	.string()
	.trim()
	.default('')
	.transform((v) => (v === '' ? null : v))
	.refine((v) => v === null || /^\d{4}-\d{2}-\d{2}$/.test(v), 'Enter the date as YYYY-MM-DD.');

const id = z.string().uuid('Choose a request or grant from the list.');

export const accessRequestSchema = z.object({
	purpose: z
		.string()
		.trim()
		.min(20, 'Say in a sentence or two what you want to use the data for (at least 20 characters).')
		.max(2000, 'Keep the purpose under 2,000 characters.')
});

export const approveRequestSchema = z.object({ requestId: id, expiresOn: optionalDay });

export const declineRequestSchema = z.object({
	requestId: id,
	reason: z
		.string()
		.trim()
		.min(1, 'Give a reason: declining a request needs one.')
		.max(2000, 'Keep the reason under 2,000 characters.')
});

export const grantSchema = z
	.object({
		email: z.string().trim().toLowerCase().default(''),
		organisationId: z.string().trim().default(''),
		expiresOn: optionalDay
	})
	.refine((g) => (g.email === '') !== (g.organisationId === ''), {
		path: ['email'],
		message: 'Give either the e-mail address of a person or an organisation.'
	})
	.refine((g) => g.email === '' || z.string().email().safeParse(g.email).success, {
		path: ['email'],
		message: 'Enter an e-mail address like name@example.org.'
	});

export const revokeSchema = z.object({ grantId: id });
