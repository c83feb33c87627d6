import { eq } from 'drizzle-orm';
import { ANONYMOUS, type Viewer } from './access';
import type { Db } from './db/client';
import { member } from './db/schema';
import { PLATFORM_ADMIN_ROLE } from './permissions';

export interface SessionUser {
	id: string;
	name: string;
	email: string;
	emailVerified: boolean;
	role?: string | null;
}

/** Build the request's Viewer from the signed-in user: their memberships and platform role. */
export async function viewerFor(db: Db, user: SessionUser | null): Promise<Viewer> {
	if (!user) return ANONYMOUS;
	const memberships = await db
		.select({ organisationId: member.organizationId, role: member.role })
		.from(member)
		.where(eq(member.userId, user.id));
	return {
		userId: user.id,
		emailVerified: user.emailVerified,
		roles: Object.fromEntries(memberships.map((m) => [m.organisationId, m.role])),
		isPlatformAdmin: user.role === PLATFORM_ADMIN_ROLE
	};
}
