import { roleCan } from '../permissions';
import type { DatasetState } from './rights';
import type { Viewer } from './viewer';

/**
 * The dataset lifecycle: draft → in review → published → retired, with "return" sending a
 * dataset in review back to its contributors (comment required). Each transition names the
 * permission of permissions.ts it needs and the states it starts from.
 */
export const TRANSITIONS = {
	submit: { from: ['draft', 'returned'], to: 'in_review', permission: 'submit' },
	return: { from: ['in_review'], to: 'returned', permission: 'review' },
	publish: { from: ['in_review'], to: 'published', permission: 'publish' },
	retire: { from: ['published'], to: 'retired', permission: 'retire' }
} as const;

export type TransitionName = keyof typeof TRANSITIONS;
export const TRANSITION_NAMES = Object.keys(TRANSITIONS) as TransitionName[];

export const STATE_WORDS: Record<string, string> = {
	draft: 'a draft',
	in_review: 'in review',
	returned: 'returned to its contributors',
	published: 'published',
	retired: 'retired'
};

const ROLE_REFUSAL: Record<TransitionName, string> = {
	submit: 'Only contributors, curators and owners of its organisation may submit a dataset.',
	return: 'Only curators and owners of its organisation may return a dataset.',
	publish: 'Only curators and owners of its organisation may publish a dataset.',
	retire: 'Only curators and owners of its organisation may retire a dataset.'
};

const FROM_WORDS: Record<TransitionName, string> = {
	submit: 'drafts and returned datasets',
	return: 'datasets in review',
	publish: 'datasets in review',
	retire: 'published datasets'
};

export const PAST: Record<TransitionName, string> = {
	submit: 'submitted',
	return: 'returned',
	publish: 'published',
	retire: 'retired'
};

/** Why the viewer may not make this transition now (role first, then state), or null if they may. */
export function transitionRefusal(
	viewer: Viewer,
	d: DatasetState,
	name: TransitionName
): string | null {
	const t = TRANSITIONS[name];
	const role = viewer.roles[d.organisationId] ?? null;
	if (!roleCan(role, 'dataset', t.permission)) return `${ROLE_REFUSAL[name]} Nothing was changed.`;
	if (!(t.from as readonly string[]).includes(d.status)) {
		return `This dataset is ${STATE_WORDS[d.status] ?? d.status}; only ${FROM_WORDS[name]} can be ${PAST[name]}. Nothing was changed.`;
	}
	return null;
}
