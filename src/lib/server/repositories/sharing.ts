import { error } from '@sveltejs/kit';
import { and, asc, count, desc, eq, inArray, isNull, not, sql } from 'drizzle-orm';
import {
	SHARING_REFUSALS,
	catalogueEntries,
	expiryRefusal,
	notFound,
	requireUuid,
	shareable,
	visibleDatasets,
	type Viewer
} from '../access';
import { utcDay } from '../clock';
import type { Db } from '../db/client';
import {
	accessGrant,
	accessRequest,
	dataset,
	member,
	organisation,
	site,
	user
} from '../db/schema';
import { roleCan } from '../permissions';
import { recordAudit } from './audit';
import type { VisibleDataset } from './datasets';

/** Size of the cells an embargoed dataset's site locations are rounded to, in degrees. */
export const COARSE_CELL_DEG = 0.1;

/** Whether the viewer may see the whole dataset now (the rule of access/visibility.ts). */
export async function seesWholeDataset(db: Db, viewer: Viewer, id: string): Promise<boolean> {
	requireUuid(id);
	const [row] = await db
		.select({ id: dataset.id })
		.from(dataset)
		.where(and(eq(dataset.id, id), visibleDatasets(viewer)));
	return Boolean(row);
}

/**
 * Catalogue entries the viewer may not open whole (restricted, or embargoed until a date), for the
 * dataset list and an organisation's page: title, organisation and visibility only, so outsiders
 * can find them and ask for access. Latest versions only (a superseded one is reached from it).
 */
export async function listCatalogueEntries(db: Db, viewer: Viewer, organisationId?: string) {
	return db
		.select({
			id: dataset.id,
			title: dataset.title,
			licence: dataset.licence,
			visibility: dataset.visibility,
			embargoUntil: dataset.embargoUntil,
			organisationName: organisation.name,
			organisationSlug: organisation.slug
		})
		.from(dataset)
		.innerJoin(organisation, eq(dataset.organisationId, organisation.id))
		.where(
			and(
				catalogueEntries(),
				isNull(dataset.supersededById),
				not(visibleDatasets(viewer)),
				organisationId === undefined ? undefined : eq(dataset.organisationId, organisationId)
			)
		)
		.orderBy(asc(dataset.title));
}

/**
 * The catalogue entry of a published restricted or embargoed dataset the viewer may not see whole:
 * title, abstract, licence, organisation and, under embargo, the site count and the sites per
 * 0.1° cell (cell centres, never a site's own position). Also the viewer's latest request. The
 * common 404 for anything else.
 */
export async function catalogueEntry(db: Db, viewer: Viewer, id: string) {
	requireUuid(id);
	const [row] = await db
		.select({
			id: dataset.id,
			title: dataset.title,
			abstract: dataset.abstract,
			licence: dataset.licence,
			visibility: dataset.visibility,
			embargoUntil: dataset.embargoUntil,
			organisationName: organisation.name,
			organisationSlug: organisation.slug
		})
		.from(dataset)
		.innerJoin(organisation, eq(dataset.organisationId, organisation.id))
		.where(and(eq(dataset.id, id), catalogueEntries()));
	if (!row) notFound();
	const embargoed = row.visibility === 'embargoed';
	// Cell indexes from the floor of each coordinate (a site is only known to lie in its cell); the
	// cell size is our constant, written into the SQL so GROUP BY sees one expression.
	const perDegree = sql.raw(String(Math.round(1 / COARSE_CELL_DEG)));
	const cellX = sql<number>`floor(ST_X(${site.location}) * ${perDegree})::int`;
	const cellY = sql<number>`floor(ST_Y(${site.location}) * ${perDegree})::int`;
	const cells = embargoed
		? await db
				.select({ x: cellX, y: cellY, sites: count() })
				.from(site)
				.where(eq(site.datasetId, id))
				.groupBy(cellX, cellY)
				.orderBy(cellY, cellX)
		: [];
	const centre = (index: number) => Math.round((index + 0.5) * COARSE_CELL_DEG * 100) / 100;
	const myRequest = viewer.userId
		? ((
				await db
					.select({
						status: accessRequest.status,
						createdAt: accessRequest.createdAt,
						reason: accessRequest.reason
					})
					.from(accessRequest)
					.where(and(eq(accessRequest.datasetId, id), eq(accessRequest.requesterId, viewer.userId)))
					.orderBy(desc(accessRequest.createdAt))
					.limit(1)
			)[0] ?? null)
		: null;
	return {
		dataset: row,
		siteCount: embargoed ? cells.reduce((n, c) => n + Number(c.sites), 0) : null,
		cells: cells.map((c) => ({
			lon: centre(Number(c.x)),
			lat: centre(Number(c.y)),
			sites: Number(c.sites)
		})),
		myRequest
	};
}

/** Members of an organisation whose role allows an action on `access`, for mail. */
async function sharers(db: Db, organisationId: string) {
	const rows = await db
		.select({ name: user.name, email: user.email, role: member.role })
		.from(member)
		.innerJoin(user, eq(member.userId, user.id))
		.where(eq(member.organizationId, organisationId));
	return rows.filter((r) => roleCan(r.role, 'access', 'answer-request'));
}

/**
 * A signed-in viewer asks for access to a dataset they may not see whole, with a purpose. 403
 * with a sentence when there is nothing to ask for or a request is still open; 404 when the
 * dataset is not a catalogue entry. Returns the request and who should hear of it.
 */
export async function requestAccess(db: Db, viewer: Viewer, datasetId: string, purpose: string) {
	if (!viewer.userId) error(401, 'Sign in first.');
	if (await seesWholeDataset(db, viewer, datasetId)) error(403, SHARING_REFUSALS.alreadyVisible);
	const entry = await catalogueEntry(db, viewer, datasetId);
	const [d] = await db
		.select({ organisationId: dataset.organisationId })
		.from(dataset)
		.where(eq(dataset.id, datasetId));
	const created = await db.transaction(async (tx) => {
		const [row] = await tx
			.insert(accessRequest)
			.values({ datasetId, requesterId: viewer.userId!, purpose })
			.onConflictDoNothing()
			.returning({ id: accessRequest.id });
		if (!row) return null;
		await recordAudit(tx, viewer, {
			action: 'request',
			organisationId: d.organisationId,
			datasetId,
			details: { requestId: row.id, purpose }
		});
		return row;
	});
	if (!created) error(403, SHARING_REFUSALS.alreadyAsked);
	return { id: created.id, entry, notify: await sharers(db, d.organisationId) };
}

/** Open requests and grants of a dataset, for those who answer requests or grant access. */
export async function sharingOverview(db: Db, found: VisibleDataset, at: Date = new Date()) {
	if (!(found.can.answerRequests || found.can.grant)) return null;
	const id = found.dataset.id;
	const requester = sql<string>`${user.name}`;
	const [requests, grants] = await Promise.all([
		db
			.select({
				id: accessRequest.id,
				purpose: accessRequest.purpose,
				createdAt: accessRequest.createdAt,
				name: requester,
				email: user.email
			})
			.from(accessRequest)
			.innerJoin(user, eq(accessRequest.requesterId, user.id))
			.where(and(eq(accessRequest.datasetId, id), eq(accessRequest.status, 'pending')))
			.orderBy(asc(accessRequest.createdAt)),
		db
			.select({
				id: accessGrant.id,
				userName: user.name,
				userEmail: user.email,
				organisationName: organisation.name,
				expiresOn: accessGrant.expiresOn,
				grantedAt: accessGrant.grantedAt,
				revokedAt: accessGrant.revokedAt
			})
			.from(accessGrant)
			.leftJoin(user, eq(accessGrant.userId, user.id))
			.leftJoin(organisation, eq(accessGrant.organisationId, organisation.id))
			.where(eq(accessGrant.datasetId, id))
			.orderBy(desc(accessGrant.grantedAt))
	]);
	const today = utcDay(at);
	return {
		requests,
		grants: grants.map((g) => ({
			...g,
			grantee: g.userName ? `${g.userName} <${g.userEmail}>` : (g.organisationName ?? ''),
			state: g.revokedAt
				? ('revoked' as const)
				: g.expiresOn !== null && g.expiresOn < today
					? ('expired' as const)
					: ('in force' as const)
		}))
	};
}

function requireShareable(found: VisibleDataset, right: 'answerRequests' | 'grant' | 'revoke') {
	const refusal = {
		answerRequests: SHARING_REFUSALS.answerRole,
		grant: SHARING_REFUSALS.grantRole,
		revoke: SHARING_REFUSALS.revokeRole
	}[right];
	if (!found.can[right]) error(403, refusal);
	if (!shareable(found.dataset)) error(403, SHARING_REFUSALS.notShareable);
}

/**
 * Approve (with an optional last day) or decline (with a reason) a pending request. Only while it
 * is still pending: of two curators answering at once one wins, the other gets 403.
 */
export async function answerRequest(
	db: Db,
	viewer: Viewer,
	found: VisibleDataset,
	requestId: string,
	answer: { approve: true; expiresOn: string | null } | { approve: false; reason: string },
	at: Date = new Date()
) {
	requireShareable(found, 'answerRequests');
	requireUuid(requestId);
	if (answer.approve) {
		const refusal = expiryRefusal(answer.expiresOn, at);
		if (refusal) error(400, `${refusal} Nothing was changed.`);
	}
	const d = found.dataset;
	const result = await db.transaction(async (tx) => {
		const [req] = await tx
			.update(accessRequest)
			.set({
				status: answer.approve ? 'approved' : 'declined',
				decidedBy: viewer.userId,
				decidedAt: at,
				reason: answer.approve ? null : answer.reason
			})
			.where(
				and(
					eq(accessRequest.id, requestId),
					eq(accessRequest.datasetId, d.id),
					eq(accessRequest.status, 'pending')
				)
			)
			.returning();
		if (!req) return null;
		let grantId: string | null = null;
		if (answer.approve) {
			const [g] = await tx
				.insert(accessGrant)
				.values({
					datasetId: d.id,
					userId: req.requesterId,
					expiresOn: answer.expiresOn,
					grantedBy: viewer.userId,
					requestId: req.id
				})
				.returning({ id: accessGrant.id });
			grantId = g.id;
		}
		await recordAudit(tx, viewer, {
			action: answer.approve ? 'grant' : 'decline',
			organisationId: d.organisationId,
			datasetId: d.id,
			details: answer.approve
				? { requestId, grantId, userId: req.requesterId, expiresOn: answer.expiresOn }
				: { requestId, userId: req.requesterId, reason: answer.reason }
		});
		return req;
	});
	if (!result) {
		const [now] = await db
			.select({ status: accessRequest.status })
			.from(accessRequest)
			.where(and(eq(accessRequest.id, requestId), eq(accessRequest.datasetId, d.id)));
		if (!now) notFound();
		error(403, SHARING_REFUSALS.alreadyAnswered(now.status));
	}
	const [requester] = await db
		.select({ name: user.name, email: user.email })
		.from(user)
		.where(eq(user.id, result.requesterId));
	return { request: result, requester };
}

/**
 * Grant access directly to the user with an e-mail address, or to an organisation. An address no
 * account uses is refused with a message (returned, nothing changed): access is never promised to
 * an address whose owner nobody knows.
 */
export async function grantAccess(
	db: Db,
	viewer: Viewer,
	found: VisibleDataset,
	to: { email: string } | { organisationId: string },
	expiresOn: string | null,
	at: Date = new Date()
): Promise<
	| { ok: true; notify: { name: string; email: string }[]; grantee: string }
	| { ok: false; message: string }
> {
	requireShareable(found, 'grant');
	const refusal = expiryRefusal(expiresOn, at);
	if (refusal) return { ok: false, message: `${refusal} Nothing was granted.` };
	const d = found.dataset;
	let grantee: { userId: string } | { organisationId: string };
	let notify: { name: string; email: string }[];
	let label: string;
	if ('email' in to) {
		const [u] = await db
			.select({ id: user.id, name: user.name, email: user.email })
			.from(user)
			.where(eq(sql`lower(${user.email})`, to.email.toLowerCase()));
		if (!u)
			return {
				ok: false,
				message: `No Thermalith account uses ${to.email}. Ask them to sign up first, then grant access again. Nothing was granted.`
			};
		grantee = { userId: u.id };
		notify = [{ name: u.name, email: u.email }];
		label = u.email;
	} else {
		const [o] = await db
			.select({ id: organisation.id, name: organisation.name })
			.from(organisation)
			.where(eq(organisation.id, to.organisationId));
		if (!o)
			return { ok: false, message: 'Choose an organisation from the list. Nothing was granted.' };
		if (o.id === d.organisationId)
			return {
				ok: false,
				message: 'Its own members see the dataset already. Nothing was granted.'
			};
		grantee = { organisationId: o.id };
		notify = (await sharers(db, o.id)).map(({ name, email }) => ({ name, email }));
		label = o.name;
	}
	await db.transaction(async (tx) => {
		const [g] = await tx
			.insert(accessGrant)
			.values({ datasetId: d.id, ...grantee, expiresOn, grantedBy: viewer.userId })
			.returning({ id: accessGrant.id });
		await recordAudit(tx, viewer, {
			action: 'grant',
			organisationId: d.organisationId,
			datasetId: d.id,
			details: { grantId: g.id, ...grantee, expiresOn }
		});
	});
	return { ok: true, notify, grantee: label };
}

/** Revoke a grant in force (kept as a record with revokedAt); 403 if it was revoked already. */
export async function revokeGrant(db: Db, viewer: Viewer, found: VisibleDataset, grantId: string) {
	requireShareable(found, 'revoke');
	requireUuid(grantId);
	const d = found.dataset;
	const revoked = await db.transaction(async (tx) => {
		const [g] = await tx
			.update(accessGrant)
			.set({ revokedAt: new Date(), revokedBy: viewer.userId })
			.where(
				and(
					eq(accessGrant.id, grantId),
					eq(accessGrant.datasetId, d.id),
					isNull(accessGrant.revokedAt)
				)
			)
			.returning();
		if (!g) return null;
		await recordAudit(tx, viewer, {
			action: 'revoke',
			organisationId: d.organisationId,
			datasetId: d.id,
			details: { grantId, userId: g.userId, organisationId: g.organisationId }
		});
		return g;
	});
	if (!revoked) {
		const [exists] = await db
			.select({ id: accessGrant.id })
			.from(accessGrant)
			.where(and(eq(accessGrant.id, grantId), eq(accessGrant.datasetId, d.id)));
		if (!exists) notFound();
		error(403, SHARING_REFUSALS.alreadyRevoked);
	}
	const notify = revoked.userId
		? await db
				.select({ name: user.name, email: user.email })
				.from(user)
				.where(eq(user.id, revoked.userId))
		: [];
	return { notify };
}

/** Organisations one may grant access to (every organisation but the dataset's own). */
export async function grantableOrganisations(db: Db, found: VisibleDataset) {
	const rows = await db
		.select({ id: organisation.id, name: organisation.name })
		.from(organisation)
		.orderBy(asc(organisation.name));
	return rows.filter((o) => o.id !== found.dataset.organisationId);
}

/** Pending requests across the datasets of an organisation, for its curators and owners. */
export async function pendingRequestsOfOrganisation(
	db: Db,
	viewer: Viewer,
	organisationId: string
) {
	if (!roleCan(viewer.roles[organisationId], 'access', 'answer-request')) return [];
	return db
		.select({
			datasetId: dataset.id,
			title: dataset.title,
			requests: count(accessRequest.id)
		})
		.from(accessRequest)
		.innerJoin(dataset, eq(accessRequest.datasetId, dataset.id))
		.where(
			and(
				eq(dataset.organisationId, organisationId),
				eq(accessRequest.status, 'pending'),
				inArray(dataset.status, ['published', 'retired'])
			)
		)
		.groupBy(dataset.id)
		.orderBy(asc(dataset.title));
}
