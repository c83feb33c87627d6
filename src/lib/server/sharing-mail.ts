import { config } from './config';
import { sendMail } from './mail';
import type { MailContent } from './mail-templates';

/** The address of a dataset's page (or its catalogue entry) in mails. */
export function datasetUrl(id: string, about = false): string {
	return `${config().ORIGIN ?? 'http://127.0.0.1:3000'}/datasets/${id}${about ? '/about' : ''}`;
}

/**
 * Queue one message to each recipient after a sharing change was committed. Mail trouble is
 * logged and never undoes the change (it is in the audit log already).
 */
export async function mailSharing(
	to: { email: string }[],
	content: MailContent,
	what: string
): Promise<void> {
	try {
		await Promise.all(to.map((r) => sendMail({ to: r.email, ...content })));
	} catch (err) {
		console.error(`[mail] could not send the ${what} notice`, err);
	}
}
