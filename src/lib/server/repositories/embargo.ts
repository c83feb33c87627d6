import { and, eq, inArray } from 'drizzle-orm';
import { ANONYMOUS, embargoPassed } from '../access';
import type { Db } from '../db/client';
import { dataset, member, organisation, user } from '../db/schema';
import { recordAudit } from './audit';

/**
 * Release every published (or retired) dataset whose embargo ended on `at`'s day or before: it
 * becomes public, and a `release` audit row (no actor: the system) is written in the same
 * transaction. The condition is the one of the visibility rule (`embargoPassed`), so the rule and
 * this job agree on the day; the conditional UPDATE releases each dataset once even if two
 * instances run the job at once. Returns the released datasets and whom to tell.
 */
export async function releaseDueEmbargoes(db: Db, at: Date) {
	const released = await db.transaction(async (tx) => {
		const rows = await tx
			.update(dataset)
			.set({ visibility: 'public', updatedAt: at, updatedBy: null })
			.where(and(inArray(dataset.status, ['published', 'retired']), embargoPassed(at)))
			.returning({
				id: dataset.id,
				title: dataset.title,
				organisationId: dataset.organisationId,
				embargoUntil: dataset.embargoUntil,
				createdBy: dataset.createdBy
			});
		for (const d of rows)
			await recordAudit(tx, ANONYMOUS, {
				action: 'release',
				organisationId: d.organisationId,
				datasetId: d.id,
				details: { embargoUntil: d.embargoUntil, to: 'public' }
			});
		return rows;
	});
	return Promise.all(
		released.map(async (d) => {
			// Those who own it: the organisation's owners and whoever created the dataset.
			const [org] = await db
				.select({ name: organisation.name })
				.from(organisation)
				.where(eq(organisation.id, d.organisationId));
			const owners = await db
				.select({ name: user.name, email: user.email })
				.from(member)
				.innerJoin(user, eq(member.userId, user.id))
				.where(and(eq(member.organizationId, d.organisationId), eq(member.role, 'owner')));
			const creator = d.createdBy
				? await db
						.select({ name: user.name, email: user.email })
						.from(user)
						.where(eq(user.id, d.createdBy))
				: [];
			const to = [...owners, ...creator];
			return {
				...d,
				organisationName: org?.name ?? '',
				notify: [...new Map(to.map((o) => [o.email, o])).values()]
			};
		})
	);
}
