import { z } from 'zod';

/** What a key may do: `read` (GET, HEAD and the computations) and `write` (every change). */
export const API_KEY_SCOPES = ['read', 'write'] as const;
export type ApiKeyScope = (typeof API_KEY_SCOPES)[number];

/** Lifetimes offered on the account page, in days; 0 = no expiry. */
export const API_KEY_LIFETIMES_DAYS = [30, 90, 365, 0] as const;

/** The account page's "new API key" form. */
export const newApiKeySchema = z.object({
	keyName: z
		.string()
		.trim()
		.min(1, 'Give the key a name (what it is for).')
		.max(80, 'At most 80 characters.'),
	access: z.enum(['read', 'read-write'], 'Choose read, or read and write.'),
	lifetimeDays: z.coerce
		.number()
		.refine(
			(d) => (API_KEY_LIFETIMES_DAYS as readonly number[]).includes(d),
			'Choose a lifetime from the list.'
		)
});

export const scopesFor = (access: 'read' | 'read-write'): ApiKeyScope[] =>
	access === 'read' ? ['read'] : ['read', 'write'];
