import { betterAuth, type BetterAuthPlugin } from 'better-auth';
import { drizzleAdapter } from 'better-auth/adapters/drizzle';
import { admin, organization } from 'better-auth/plugins';
import { createAccessControl } from 'better-auth/plugins/access';
import { defaultStatements as adminStatements } from 'better-auth/plugins/admin/access';
import type { Db } from '../db/client';
import * as schema from '../db/schema';
import { mailTemplates, type MailContent } from '../mail-templates';
import { ac, roles, ROLE_LABELS, isOrgRole } from '../permissions';
import { and, eq, like } from 'drizzle-orm';
import { CLIENT_ADDRESS_HEADER } from './client-address';
import { cookieSettings } from './cookies';
import { allowUserToCreateOrganization, organisationHooks } from './organisation-hooks';
import { betterAuthRateRules } from './rate-rules';
import { signInGuard } from './sign-in-guard';

export interface AuthSettings {
	db: Db;
	secret: string;
	baseURL: string;
	/** Deliver a message; the app passes SMTP, tests may pass a recorder. */
	send: (to: string, mail: MailContent) => Promise<void>;
	/** Production or start profile (cookies no longer depend on it: see cookies.ts). */
	production: boolean;
	/** SvelteKit cookie bridge for form actions (better-auth/svelte-kit sveltekitCookies). */
	extraPlugins?: BetterAuthPlugin[];
}

// Platform administration without impersonation: the statement lists every admin action but
// 'impersonate' and 'impersonate-admins', so those endpoints refuse everyone.
const platformAc = createAccessControl(adminStatements);
const platformRoles = {
	admin: platformAc.newRole({
		user: ['create', 'list', 'set-role', 'ban', 'delete', 'set-password', 'get', 'update'],
		session: ['list', 'revoke', 'delete']
	}),
	user: platformAc.newRole({ user: [], session: [] })
};

/** Build the better-auth instance. Pure of SvelteKit so scripts and tests can create one. */
export function createAuth(s: AuthSettings) {
	const link = (path: string, token: string) =>
		`${s.baseURL}${path}?token=${encodeURIComponent(token)}`;
	return betterAuth({
		appName: 'Thermalith',
		baseURL: s.baseURL,
		secret: s.secret,
		trustedOrigins: [s.baseURL],
		database: drizzleAdapter(s.db, {
			provider: 'pg',
			schema: { ...schema, organisation: schema.organisation }
		}),
		emailAndPassword: {
			enabled: true,
			minPasswordLength: 10,
			// Signing up never says whether an address has an account: with autoSignIn off better-auth
			// answers a duplicate like a new sign-up, and the address's owner gets a note instead.
			// The confirmation link signs the new user in (autoSignInAfterVerification).
			autoSignIn: false,
			onExistingUserSignUp: async ({ user }) => {
				await s.send(
					user.email,
					mailTemplates.existingAccount(
						user.name,
						`${s.baseURL}/sign-in`,
						`${s.baseURL}/forgot-password`
					)
				);
			},
			// A used reset link retires every other reset link of the account.
			onPasswordReset: async ({ user }) => {
				await s.db
					.delete(schema.verification)
					.where(
						and(
							eq(schema.verification.value, user.id),
							like(schema.verification.identifier, 'reset-password:%')
						)
					);
			},
			// Unverified accounts may sign in and browse; uploading checks emailVerified.
			requireEmailVerification: false,
			resetPasswordTokenExpiresIn: 60 * 60,
			revokeSessionsOnPasswordReset: true,
			sendResetPassword: async ({ user, token }) => {
				await s.send(
					user.email,
					mailTemplates.resetPassword(user.name, link('/reset-password', token))
				);
			}
		},
		emailVerification: {
			sendOnSignUp: true,
			autoSignInAfterVerification: true,
			expiresIn: 24 * 60 * 60,
			sendVerificationEmail: async ({ user, url, token }) => {
				// The page to come back to (an invitation, say) rides along in the link; the
				// confirmation page checks it again with the open-redirect rule before following it.
				const next = new URL(url).searchParams.get('callbackURL');
				// better-auth passes "/" when no page asked to be returned to (a change of address).
				const back =
					next?.startsWith('/') && next !== '/' ? `&next=${encodeURIComponent(next)}` : '';
				await s.send(
					user.email,
					mailTemplates.verifyEmail(user.name, link('/verify-email', token) + back)
				);
			}
		},
		user: {
			changeEmail: {
				enabled: true,
				// Sent to the CURRENT address: its owner approves the move; better-auth then sends the
				// new address a normal verification link and switches only after that is opened.
				sendChangeEmailConfirmation: async ({ user, newEmail, token }) => {
					await s.send(
						user.email,
						mailTemplates.changeEmail(user.name, newEmail, link('/verify-email', token))
					);
				}
			}
		},
		session: { expiresIn: 60 * 60 * 24 * 14, updateAge: 60 * 60 * 24 },
		rateLimit: {
			enabled: true,
			storage: 'database',
			window: 60,
			max: 200,
			customRules: betterAuthRateRules
		},
		advanced: {
			...cookieSettings(s.baseURL),
			// The client's address as the app saw the connection, never X-Forwarded-For as sent.
			ipAddress: { ipAddressHeaders: [CLIENT_ADDRESS_HEADER] },
			// better-auth skips its origin check when NODE_ENV is "test"; the tested build must not.
			disableOriginCheck: false,
			// Mail goes out after the answer, so an answer takes as long whether or not an address
			// has an account (a reset request for a known address used to take 16 times longer).
			backgroundTasks: {
				handler: (task) => {
					task.catch((err: unknown) => console.error('background mail or task failed:', err));
				}
			}
		},
		hooks: signInGuard(s.db),
		plugins: [
			organization({
				ac,
				roles,
				creatorRole: 'owner',
				invitationExpiresIn: 7 * 24 * 60 * 60,
				cancelPendingInvitationsOnReInvite: true,
				allowUserToCreateOrganization,
				organizationHooks: organisationHooks,
				schema: {
					organization: {
						modelName: 'organisation',
						additionalFields: {
							country: { type: 'string', required: false, input: true },
							website: { type: 'string', required: false, input: true },
							description: { type: 'string', required: false, input: true }
						}
					}
				},
				sendInvitationEmail: async ({ id, email, role, organization: org, inviter }) => {
					const roleLabel = isOrgRole(role) ? ROLE_LABELS[role].toLowerCase() : role;
					await s.send(
						email,
						mailTemplates.invitation(
							org.name,
							inviter.user.name,
							roleLabel,
							`${s.baseURL}/invitations/${id}`
						)
					);
				}
			}),
			admin({ ac: platformAc, roles: platformRoles, adminRoles: ['admin'], defaultRole: 'user' }),
			...(s.extraPlugins ?? [])
		]
	});
}

export type Auth = ReturnType<typeof createAuth>;
