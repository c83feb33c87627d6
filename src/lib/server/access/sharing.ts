import { utcDay } from '../clock';
import type { DatasetState } from './rights';

/**
 * Sharing a dataset outside its organisation: which datasets take requests and grants, and the
 * sentences of a refusal (403, nothing changed). Grants only matter on published (or retired)
 * restricted and embargoed datasets: public ones need none, private ones are for members only,
 * and unpublished ones are the organisation's work in progress.
 */
export function shareable(d: DatasetState & { visibility: string }): boolean {
	return (
		(d.status === 'published' || d.status === 'retired') &&
		(d.visibility === 'restricted' || d.visibility === 'embargoed')
	);
}

export const SHARING_REFUSALS = {
	notShareable:
		'Access is granted only to published restricted or embargoed datasets. Nothing was changed.',
	answerRole:
		'Only curators and owners of its organisation may answer access requests. Nothing was changed.',
	grantRole: 'Only curators and owners of its organisation may grant access. Nothing was changed.',
	revokeRole:
		'Only curators and owners of its organisation may revoke access. Nothing was changed.',
	alreadyVisible:
		'You can see this dataset already; there is nothing to ask for. Nothing was changed.',
	alreadyAnswered: (state: string) => `This request was ${state} already. Nothing was changed.`,
	alreadyAsked:
		'You asked for access to this dataset already; its curators have not answered yet. Nothing was changed.',
	alreadyRevoked: 'This grant was revoked already. Nothing was changed.'
} as const;

/** A last day of access before today is refused (UTC, the clock of ../clock.ts). */
export function expiryRefusal(expiresOn: string | null, at: Date = new Date()): string | null {
	return expiresOn !== null && expiresOn < utcDay(at)
		? 'The last day of access cannot be in the past.'
		: null;
}

/**
 * A new embargo (the dataset becomes embargoed, or its release date changes) must end today or
 * later: a date in the past would publish at once what was meant to be held back.
 */
export function embargoDateRefusal(
	before: { visibility: string; embargoUntil: string | null } | null,
	after: { visibility: string; embargoUntil: string | null },
	at: Date = new Date()
): string | null {
	if (after.visibility !== 'embargoed' || after.embargoUntil === null) return null;
	const unchanged =
		before?.visibility === 'embargoed' && before.embargoUntil === after.embargoUntil;
	if (unchanged || after.embargoUntil >= utcDay(at)) return null;
	return 'The release date of a new embargo cannot be in the past.';
}
