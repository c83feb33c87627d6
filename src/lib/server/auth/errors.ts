import { fail } from '@sveltejs/kit';
import { APIError } from 'better-auth/api';

/** better-auth's error codes, in words a user can act on. */
const MESSAGES: Record<string, string> = {
	INVALID_EMAIL_OR_PASSWORD: 'That e-mail address and password do not match.',
	USER_ALREADY_EXISTS:
		'An account with this e-mail address exists already. Sign in or reset the password.',
	USER_ALREADY_EXISTS_USE_ANOTHER_EMAIL: 'An account with this e-mail address exists already.',
	INVALID_TOKEN: 'This link is invalid, already used or expired. Ask for a new one.',
	TOKEN_EXPIRED: 'This link has expired. Ask for a new one.',
	INVALID_PASSWORD: 'The current password is not right.',
	PASSWORD_TOO_SHORT: 'Use at least 10 characters.',
	ORGANIZATION_ALREADY_EXISTS: 'That short name is taken; choose another.',
	ORGANIZATION_SLUG_ALREADY_TAKEN: 'That short name is taken; choose another.',
	YOU_CANNOT_LEAVE_THE_ORGANIZATION_AS_THE_ONLY_OWNER:
		'You are the only owner. Make another member owner before you leave.',
	YOU_CANNOT_LEAVE_THE_ORGANIZATION_WITHOUT_AN_OWNER:
		'The organisation needs at least one owner. Make another member owner first.',
	USER_IS_ALREADY_A_MEMBER_OF_THIS_ORGANIZATION: 'That person is a member already.',
	USER_IS_ALREADY_INVITED_TO_THIS_ORGANIZATION: 'That address has a pending invitation already.',
	YOU_ARE_NOT_ALLOWED_TO_CREATE_A_NEW_ORGANIZATION:
		'Confirm your e-mail address before you create an organisation.',
	EMAIL_NOT_CONFIRMED: 'Confirm your e-mail address before you invite people.',
	INVALID_WEB_ADDRESS: 'Enter a web address starting with https://',
	BANNED_USER: 'This account is suspended. Contact the platform administrators.'
};

/** Turn an error from auth.api.* into fail(status, { message }) for a form action; rethrow others. */
export function authFailure(err: unknown, extra: Record<string, unknown> = {}) {
	if (err instanceof APIError) {
		const code = (err.body as { code?: string } | undefined)?.code ?? '';
		const message = MESSAGES[code] ?? err.body?.message ?? err.message ?? 'That did not work.';
		return fail(err.statusCode || 400, { message, ...extra });
	}
	throw err;
}
