import { mayReadAudit } from '$lib/server/repositories/audit';
import type { LayoutServerLoad } from './$types';

export const load: LayoutServerLoad = ({ locals }) => ({
	user: locals.user
		? {
				name: locals.user.name,
				email: locals.user.email,
				emailVerified: locals.user.emailVerified,
				isPlatformAdmin: locals.viewer.isPlatformAdmin,
				mayReadAudit: mayReadAudit(locals.viewer)
			}
		: null
});
