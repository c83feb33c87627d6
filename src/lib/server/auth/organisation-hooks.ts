import { APIError } from 'better-auth/api';
import { websiteSchema } from '../../schemas/organisation';

type OrganisationInput = { website?: unknown; logo?: unknown };

/**
 * better-auth's own /api/auth/organization/create and /update accept any string for additional
 * fields; these hooks apply the product's website rule to every path that creates or changes an
 * organisation (form actions call the same endpoints), so a `javascript:` address is never stored.
 * `logo` is an address too (better-auth's built-in field): it gets the same rule.
 */
function checkAddresses(org: OrganisationInput) {
	for (const field of ['website', 'logo'] as const) {
		const value = org[field];
		if (value === undefined || value === null) continue;
		const parsed = websiteSchema.safeParse(value);
		if (!parsed.success) {
			throw new APIError('BAD_REQUEST', {
				code: 'INVALID_WEB_ADDRESS',
				message: `${field}: ${parsed.error.issues[0]?.message ?? 'not a web address'}`
			});
		}
	}
}

/**
 * Organisations and invitation e-mails speak in an organisation's name, so only an account whose
 * own address is confirmed may create one or invite people (an unconfirmed account could otherwise
 * mail anyone "an invitation from <any name>"). Both paths run through better-auth's endpoints,
 * which the product's forms call too, so this is the one place for the rule.
 */
export const EMAIL_NOT_CONFIRMED = 'EMAIL_NOT_CONFIRMED';

export const allowUserToCreateOrganization = (user: { emailVerified?: boolean }) =>
	user.emailVerified === true;

export const organisationHooks = {
	beforeCreateInvitation: async ({ inviter }: { inviter: { emailVerified?: boolean } }) => {
		if (inviter.emailVerified !== true) {
			throw new APIError('FORBIDDEN', {
				code: EMAIL_NOT_CONFIRMED,
				message: 'Confirm your e-mail address before you invite people.'
			});
		}
	},
	beforeCreateOrganization: async ({ organization }: { organization: OrganisationInput }) => {
		checkAddresses(organization);
	},
	beforeUpdateOrganization: async ({ organization }: { organization: OrganisationInput }) => {
		checkAddresses(organization);
	}
};
