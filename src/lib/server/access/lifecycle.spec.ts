import { describe, expect, it } from 'vitest';
import { datasetRights } from './rights';
import { transitionRefusal, type TransitionName } from './lifecycle';
import { ANONYMOUS, type Viewer } from './viewer';

/* The lifecycle rules as a table (README.md here, "Lifecycle"); common practice, no source. */
const ORG = 'org-a';
const as = (role: string | null, extra: Partial<Viewer> = {}): Viewer => ({
	...ANONYMOUS,
	userId: 'u',
	emailVerified: true,
	roles: role ? { [ORG]: role } : {},
	...extra
});
const STATES = ['draft', 'in_review', 'returned', 'published', 'retired'];
const ROLES = ['viewer', 'contributor', 'curator', 'owner', null];

/** Allowed (state, role) pairs per transition; everything else is refused. */
const ALLOWED: Record<TransitionName, string[]> = {
	submit: [
		'draft/contributor',
		'draft/curator',
		'draft/owner',
		'returned/contributor',
		'returned/curator',
		'returned/owner'
	],
	return: ['in_review/curator', 'in_review/owner'],
	publish: ['in_review/curator', 'in_review/owner'],
	retire: ['published/curator', 'published/owner']
};

describe('transitionRefusal', () => {
	for (const [name, allowed] of Object.entries(ALLOWED) as [TransitionName, string[]][]) {
		it(`${name}: allowed exactly for ${allowed.join(', ')}`, () => {
			for (const status of STATES)
				for (const role of ROLES) {
					const refusal = transitionRefusal(as(role), { organisationId: ORG, status }, name);
					expect(refusal === null, `${status}/${role}`).toBe(allowed.includes(`${status}/${role}`));
					if (refusal) expect(refusal).toMatch(/Nothing was changed\.$/);
				}
		});
	}

	it('gives platform administrators no lifecycle rights in organisations they are not in', () => {
		const admin = as(null, { isPlatformAdmin: true });
		for (const name of Object.keys(ALLOWED) as TransitionName[])
			for (const status of STATES)
				expect(transitionRefusal(admin, { organisationId: ORG, status }, name)).not.toBeNull();
	});
});

describe('datasetRights', () => {
	it('lets contributors change drafts, curators also datasets in review, nobody published ones', () => {
		const upload = (role: string, status: string) =>
			datasetRights(as(role), { organisationId: ORG, status }).can.upload;
		expect(upload('contributor', 'draft')).toBe(true);
		expect(upload('contributor', 'in_review')).toBe(false);
		expect(upload('curator', 'in_review')).toBe(true);
		expect(upload('owner', 'published')).toBe(false);
		expect(upload('viewer', 'draft')).toBe(false);
	});

	it('asks for a confirmed address before uploading', () => {
		const r = datasetRights(as('contributor', { emailVerified: false }), {
			organisationId: ORG,
			status: 'draft'
		});
		expect(r.can.upload).toBe(false);
		expect(r.uploadRefusal).toBe('Confirm your e-mail address before you upload.');
	});
});

describe('datasetRights: versions and deleting', () => {
	const right = (
		role: string | null,
		status: string,
		extra: object = {},
		v: Partial<Viewer> = {}
	) => datasetRights(as(role, v), { organisationId: ORG, status, ...extra }).can;

	it('lets contributors, curators and owners correct the latest published version only', () => {
		for (const role of ['contributor', 'curator', 'owner'])
			expect(right(role, 'published').correct, role).toBe(true);
		for (const role of ['viewer', null]) expect(right(role, 'published').correct).toBe(false);
		for (const status of ['draft', 'in_review', 'returned', 'retired'])
			expect(right('curator', status).correct, status).toBe(false);
		expect(right('curator', 'published', { supersededById: 'newer' }).correct).toBe(false);
		expect(right('curator', 'published', {}, { emailVerified: false }).correct).toBe(false);
		expect(right(null, 'published', {}, { isPlatformAdmin: true }).correct).toBe(false);
	});

	it('lets curators and owners delete only what was never published', () => {
		for (const status of ['draft', 'in_review', 'returned']) {
			expect(right('curator', status).deleteDataset, status).toBe(true);
			expect(right('owner', status).deleteDataset, status).toBe(true);
			expect(right('contributor', status).deleteDataset, status).toBe(false);
		}
		for (const status of ['published', 'retired'])
			expect(right('owner', status).deleteDataset, status).toBe(false);
	});
});
