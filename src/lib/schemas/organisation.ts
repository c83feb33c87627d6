import { z } from 'zod';
import { ORG_ROLES } from '$lib/roles';

const optionalText = (max: number) =>
	z
		.string()
		.trim()
		.max(max, `Use at most ${max} characters.`)
		.transform((v) => (v === '' ? undefined : v))
		.optional();

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
	website: z
		.string()
		.trim()
		.transform((v) => (v === '' ? undefined : v))
		.optional()
		.refine(
			(v) => v === undefined || /^https?:\/\/\S+\.\S+/.test(v),
			'Enter a web address starting with https://'
		),
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
