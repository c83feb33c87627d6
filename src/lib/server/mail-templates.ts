/**
 * Thermalith's transactional messages: each has a plain-text and an HTML part, carries the
 * product's name, and contains no tracking (no remote images, no redirecting links).
 */
export interface MailContent {
	subject: string;
	text: string;
	html: string;
}

const escape = (s: string) =>
	s.replace(
		/[&<>"']/g,
		(c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!
	);

function compose(
	subject: string,
	intro: string,
	action: { label: string; url: string },
	outro: string
): MailContent {
	const text = `${intro}\n\n${action.label}: ${action.url}\n\n${outro}\n\n— Thermalith`;
	const html = `<!doctype html><html><body style="font-family:Lato,Arial,sans-serif;color:#1c242d;max-width:36rem">
<p style="font-weight:bold;font-size:18px;color:#2b3642">Thermalith</p>
<p>${escape(intro)}</p>
<p><a href="${escape(action.url)}" style="display:inline-block;background:#d2771c;color:#11161c;padding:10px 16px;border-radius:6px;text-decoration:none;font-weight:bold">${escape(action.label)}</a></p>
<p style="font-size:13px;color:#526877">Or paste this address into your browser: ${escape(action.url)}</p>
<p style="font-size:13px;color:#526877">${escape(outro)}</p>
</body></html>`;
	return { subject: `${subject} · Thermalith`, text, html };
}

export const mailTemplates = {
	verifyEmail: (name: string, url: string) =>
		compose(
			'Confirm your e-mail address',
			`Hello ${name}, confirm this address to finish setting up your Thermalith account. Until then you can browse public data but not upload.`,
			{ label: 'Confirm my address', url },
			'If you did not sign up, ignore this message. The link expires in 24 hours.'
		),
	resetPassword: (name: string, url: string) =>
		compose(
			'Reset your password',
			`Hello ${name}, someone (hopefully you) asked to reset the password of your Thermalith account.`,
			{ label: 'Choose a new password', url },
			'The link works once and expires in one hour. If you did not ask for it, ignore this message; your password stays as it is.'
		),
	changeEmail: (name: string, newEmail: string, url: string) =>
		compose(
			'Approve the change of your e-mail address',
			`Hello ${name}, someone signed in to your Thermalith account asked to move it to ${newEmail}. Approve it here; we will then send a confirmation link to ${newEmail}.`,
			{ label: 'Approve the change', url },
			'If you did not ask for this, ignore this message and your address stays as it is; consider changing your password.'
		),
	existingAccount: (name: string, signInUrl: string, resetUrl: string) =>
		compose(
			'You already have a Thermalith account',
			`Hello ${name}, someone (hopefully you) tried to create a Thermalith account with this address, which has one already. Sign in at ${signInUrl}, or choose a new password if you forgot it.`,
			{ label: 'Choose a new password', url: resetUrl },
			'If this was not you, ignore this message: nothing changed on your account.'
		),
	/** A dataset moved through its lifecycle (see access/lifecycle.ts); comment on returns. */
	datasetTransition: (
		d: { title: string; organisationName: string },
		event: { actorName: string; past: string; comment: string | null },
		url: string
	) =>
		compose(
			`"${d.title}" was ${event.past}`,
			`${event.actorName} ${event.past} the dataset "${d.title}" of ${d.organisationName}.` +
				(event.comment ? ` Their comment: ${event.comment}` : ''),
			{ label: 'Open the dataset', url },
			'You receive this because you work on this dataset or review datasets for the organisation.'
		),
	/** The release job made an embargoed dataset public (jobs/embargo-release.ts). */
	embargoReleased: (
		d: { title: string; organisationName: string; embargoUntil: string | null },
		url: string
	) =>
		compose(
			`"${d.title}" is now public`,
			`The embargo on the dataset "${d.title}" of ${d.organisationName} ended${d.embargoUntil ? ` on ${d.embargoUntil}` : ''}. Thermalith released it: anyone can now see its sites, values and files.`,
			{ label: 'Open the dataset', url },
			'You receive this because you own this dataset or its organisation.'
		),
	/** Someone asked for access (to the curators and owners of its organisation). */
	accessRequested: (d: { title: string }, requester: string, purpose: string, url: string) =>
		compose(
			`Access requested to "${d.title}"`,
			`${requester} asked for access to the dataset "${d.title}". Their purpose: ${purpose}`,
			{ label: 'Answer the request', url },
			'You receive this because you answer access requests for the organisation.'
		),
	/** Access was granted (on request or directly) to a person or an organisation. */
	accessGranted: (d: { title: string }, expiresOn: string | null, url: string) =>
		compose(
			`Access granted to "${d.title}"`,
			`You now have access to the dataset "${d.title}"${expiresOn ? ` until ${expiresOn} (inclusive)` : ''}: its sites, values and files are open to you on Thermalith.`,
			{ label: 'Open the dataset', url },
			'You receive this because a curator of the dataset granted you or your organisation access.'
		),
	accessDeclined: (d: { title: string }, reason: string, url: string) =>
		compose(
			`Access request to "${d.title}" declined`,
			`Your request for access to the dataset "${d.title}" was declined. The curator's reason: ${reason}`,
			{ label: 'See the dataset', url },
			'You receive this because you asked for access to this dataset.'
		),
	accessRevoked: (d: { title: string }, url: string) =>
		compose(
			`Access to "${d.title}" revoked`,
			`Your access to the dataset "${d.title}" was revoked by its curators.`,
			{ label: 'See the dataset', url },
			'You receive this because you had access to this dataset.'
		),
	invitation: (organisation: string, inviter: string, role: string, url: string) =>
		compose(
			`Invitation to join ${organisation}`,
			`${inviter} invited you to join ${organisation} on Thermalith as ${role}.`,
			{ label: 'See the invitation', url },
			'Sign in or create an account with this e-mail address to accept or decline. The invitation expires in 7 days.'
		)
};
