/** Read caught mail from the test mail catcher (its JSON API), waiting for a message to arrive. */
export async function waitForMail(
	address: string,
	subjectStartsWith: string,
	timeoutMs = 60_000
): Promise<{ subject: string; text: string; html: string }> {
	const base = process.env.MAIL_VIEWER_URL;
	if (!base)
		throw new Error('MAIL_VIEWER_URL is not set: run the end-to-end tests through `npm test`');
	const deadline = Date.now() + timeoutMs;
	while (Date.now() < deadline) {
		const res = await fetch(`${base}/api/messages?to=${encodeURIComponent(address)}`);
		const list = (await res.json()) as { subject: string; text: string; html: string }[];
		const found = list.find((m) => m.subject.startsWith(subjectStartsWith));
		if (found) return found;
		await new Promise((r) => setTimeout(r, 200));
	}
	throw new Error(`no "${subjectStartsWith}" mail for ${address} within ${timeoutMs} ms`);
}

/** The first link in a plain-text message. */
export function firstLink(text: string): string {
	const match = text.match(/https?:\/\/\S+/);
	if (!match) throw new Error(`no link in: ${text}`);
	return match[0];
}

/** Like waitForMail, for a message whose text also contains `includes` (a dataset's address). */
export async function waitForMailAbout(
	address: string,
	subjectStartsWith: string,
	includes: string,
	timeoutMs = 60_000
): Promise<{ subject: string; text: string; html: string }> {
	const base = process.env.MAIL_VIEWER_URL;
	if (!base)
		throw new Error('MAIL_VIEWER_URL is not set: run the end-to-end tests through `npm test`');
	const deadline = Date.now() + timeoutMs;
	while (Date.now() < deadline) {
		const res = await fetch(`${base}/api/messages?to=${encodeURIComponent(address)}`);
		const list = (await res.json()) as { subject: string; text: string; html: string }[];
		const found = list.find(
			(m) => m.subject.startsWith(subjectStartsWith) && m.text.includes(includes)
		);
		if (found) return found;
		await new Promise((r) => setTimeout(r, 200));
	}
	throw new Error(`no "${subjectStartsWith}" mail about ${includes} for ${address}`);
}
