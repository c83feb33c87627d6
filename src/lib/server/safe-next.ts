/** Only follow `next=` to a path on this site, never to another origin (open-redirect guard). */
export function safeNext(next: string | null | undefined, fallback = '/account'): string {
	if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\'))
		return fallback;
	return next;
}
