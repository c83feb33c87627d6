import { z } from 'zod';
// Relative, not $lib: the better-auth hooks (also loaded by scripts outside SvelteKit) use this file.
import { ORG_ROLES } from '../roles';
import { safeHttpUrl } from '../safe-url';

const optionalText = (max: number) =>
	z
		.string()
		.trim()
		.max(max, `Use at most ${max} characters.`)
		.transform((v) => (v === '' ? undefined : v))
		.optional();

/**
 * An organisation's website: empty, or an http(s) address. The form and the better-auth
 * organisation hooks (which guard its own /api/auth/organization/* endpoints) both use this one rule.
 */
export const websiteSchema = z
	.string()
	.trim()
	.max(300, 'Use at most 300 characters.')
	.refine((v) => v === '' || safeHttpUrl(v) !== null, 'Enter a web address starting with https://');

export const organisationSchema = z.object({
	name: z.string().trim().min(3, 'Enter the organisation’s name (at least 3 characters).').max(120),
	slug: z
		.string()
		.trim()
		.toLowerCase()
		.regex(
			/^[a-z0-9](?:[a-z0-9-]{1,46}[a-z0-9])$/,
			'Use 3–48 lower-case letters, digits and hyphens.'
		),
	country: optionalText(80),
	website: websiteSchema.transform((v) => (v === '' ? undefined : v)).optional(),
	description: optionalText(2000)
});

export const roleSchema = z.enum(ORG_ROLES, {
	message: 'Choose owner, curator, contributor or viewer.'
});

export const inviteSchema = z.object({
	email: z.string().trim().toLowerCase().email('Enter an e-mail address like name@example.org.'),
	role: roleSchema
});

export const changeRoleSchema = z.object({ memberId: z.string().min(1), role: roleSchema });
export const memberIdSchema = z.object({ memberId: z.string().min(1) });
