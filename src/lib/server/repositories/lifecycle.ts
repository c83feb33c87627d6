import { error } from '@sveltejs/kit';
import { and, desc, eq, inArray } from 'drizzle-orm';
import {
	PAST,
	TRANSITIONS,
	TRANSITION_NAMES,
	transitionRefusal,
	type TransitionName,
	type Viewer
} from '../access';
import type { Db } from '../db/client';
import { auditEvent, dataset, member, user, type Dataset } from '../db/schema';
import { roleCan } from '../permissions';
import { recordAudit, type DbOrTx } from './audit';
import { datasetForViewer } from './datasets';
import { supersedePrevious } from './versions';

/** "Cora Curator published it on 2026-12-02 at 08:10 UTC", from the latest transition recorded. */
async function lastTransition(db: DbOrTx, datasetId: string): Promise<string> {
	const [last] = await db
		.select({ action: auditEvent.action, actorName: auditEvent.actorName, at: auditEvent.at })
		.from(auditEvent)
		.where(and(eq(auditEvent.datasetId, datasetId), inArray(auditEvent.action, TRANSITION_NAMES)))
		.orderBy(desc(auditEvent.at))
		.limit(1);
	if (!last) return '';
	const when = last.at.toISOString().slice(0, 16).replace('T', ' at ');
	return ` ${last.actorName ?? 'Someone'} ${PAST[last.action as TransitionName]} it on ${when} UTC.`;
}

/**
 * Move a dataset the viewer can see through one lifecycle transition, or refuse with 403 and a
 * sentence (nothing changed). The UPDATE only applies while the dataset is still in a starting
 * state, so of two curators publishing at once exactly one wins; the other is told who did what.
 * The audit row is written in the same transaction.
 */
export async function transitionDataset(
	db: Db,
	viewer: Viewer,
	datasetId: string,
	name: TransitionName,
	comment: string | null
): Promise<{ dataset: Dataset; from: string } | { missingComment: true }> {
	const found = await datasetForViewer(db, viewer, datasetId);
	const refusal = transitionRefusal(viewer, found.dataset, name);
	if (refusal) {
		const roleOk = roleCan(found.role, 'dataset', TRANSITIONS[name].permission);
		error(403, refusal + (roleOk ? await lastTransition(db, datasetId) : ''));
	}
	if (name === 'return' && !comment?.trim()) {
		error(
			400,
			'Say what needs to change: returning a dataset needs a comment. Nothing was changed.'
		);
	}
	const t = TRANSITIONS[name];
	const result = await db.transaction(async (tx) => {
		const [updated] = await tx
			.update(dataset)
			.set({
				status: t.to,
				updatedBy: viewer.userId,
				updatedAt: new Date(),
				...(name === 'publish' ? { publishedAt: new Date() } : {})
			})
			.where(and(eq(dataset.id, datasetId), inArray(dataset.status, [...t.from])))
			.returning();
		if (!updated) return null;
		// A new version supersedes the one it corrects when it is published (versions.ts).
		const supersedes = name === 'publish' ? updated.previousVersionId : null;
		if (supersedes) await supersedePrevious(tx, updated);
		await recordAudit(tx, viewer, {
			action: name,
			organisationId: updated.organisationId,
			datasetId,
			details: {
				from: found.dataset.status,
				to: t.to,
				...(comment ? { comment } : {}),
				...(supersedes ? { supersedes } : {})
			}
		});
		return { dataset: updated, from: found.dataset.status };
	});
	if (!result) {
		const [now] = await db
			.select({ status: dataset.status })
			.from(dataset)
			.where(eq(dataset.id, datasetId));
		error(
			403,
			`Someone changed this dataset a moment ago; it is now ${now?.status.replace('_', ' ') ?? 'gone'}. Nothing was changed.${await lastTransition(db, datasetId)}`
		);
	}
	return result;
}

/** The latest comment a dataset was returned with, for its page (members only see the page state). */
export async function lastReturnComment(db: Db, datasetId: string) {
	const [row] = await db
		.select({ details: auditEvent.details, actorName: auditEvent.actorName, at: auditEvent.at })
		.from(auditEvent)
		.where(and(eq(auditEvent.datasetId, datasetId), eq(auditEvent.action, 'return')))
		.orderBy(desc(auditEvent.at))
		.limit(1);
	if (!row || typeof row.details.comment !== 'string') return null;
	return { comment: row.details.comment, by: row.actorName ?? 'a curator', at: row.at };
}

/**
 * Who hears of a transition: on submit, the organisation's curators and owners (those whose role
 * may review); otherwise the dataset's creator and whoever last submitted it. Never the actor.
 */
export async function transitionRecipients(
	db: Db,
	viewer: Viewer,
	d: Dataset,
	name: TransitionName
): Promise<{ name: string; email: string }[]> {
	let rows: { name: string; email: string; id: string }[];
	if (name === 'submit') {
		const members = await db
			.select({ id: user.id, name: user.name, email: user.email, role: member.role })
			.from(member)
			.innerJoin(user, eq(member.userId, user.id))
			.where(eq(member.organizationId, d.organisationId));
		rows = members.filter((m) => roleCan(m.role, 'dataset', 'review'));
	} else {
		const submitters = await db
			.select({ actorId: auditEvent.actorId })
			.from(auditEvent)
			.where(and(eq(auditEvent.datasetId, d.id), eq(auditEvent.action, 'submit')))
			.orderBy(desc(auditEvent.at))
			.limit(1);
		const ids = [d.createdBy, submitters[0]?.actorId].filter((x): x is string => Boolean(x));
		rows = ids.length
			? await db
					.select({ id: user.id, name: user.name, email: user.email })
					.from(user)
					.where(inArray(user.id, ids))
			: [];
	}
	const others = rows.filter((r) => r.id !== viewer.userId);
	return [...new Map(others.map((r) => [r.email, { name: r.name, email: r.email }])).values()];
}
