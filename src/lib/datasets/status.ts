/**
 * Dataset lifecycle states and visibility as people read them, shared by pages and mails. The
 * enum values live in the database schema; these are only words.
 */
export const STATUS_LABELS: Record<string, string> = {
	draft: 'Draft',
	in_review: 'In review',
	returned: 'Returned for changes',
	published: 'Published',
	retired: 'Retired'
};

/**
 * A dataset's status as shown: a published version that a newer one has replaced reads
 * "Superseded" (its stored status stays `published`, so it remains readable and citable).
 */
export function statusLabel(d: { status: string; supersededById?: string | null }): string {
	if (d.status === 'published' && d.supersededById) return 'Superseded';
	return STATUS_LABELS[d.status] ?? d.status;
}

export const VISIBILITY_LABELS: Record<string, string> = {
	public: 'public',
	embargoed: 'embargoed',
	restricted: 'restricted',
	private: 'private to the organisation'
};

/** One sentence saying who can see the dataset now, so a draft never reads as public. */
export function audienceSentence(d: {
	status: string;
	visibility: string;
	embargoUntil: string | null;
}): string {
	if (d.status !== 'published' && d.status !== 'retired')
		return 'Not published: only members of the organisation can see it.';
	switch (d.visibility) {
		case 'public':
			return 'Anyone can see it.';
		case 'embargoed':
			return d.embargoUntil
				? `Members and those granted access only until ${d.embargoUntil}, then anyone; until then anyone sees its summary and coarse locations.`
				: 'Members and those granted access only until its release date.';
		case 'restricted':
			return 'Only members of the organisation and those granted access can see it.';
		default:
			return 'Only members of the organisation can see it.';
	}
}
