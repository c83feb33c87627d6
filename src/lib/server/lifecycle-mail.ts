import type { TransitionName, Viewer } from './access';
import { PAST } from './access';
import { config } from './config';
import type { Db } from './db/client';
import type { Dataset } from './db/schema';
import { sendMail } from './mail';
import { mailTemplates } from './mail-templates';
import { transitionRecipients } from './repositories/lifecycle';

/**
 * Tell those concerned about a transition that has been committed. Mail trouble is logged, never
 * undoes the transition (it is already recorded in the audit log).
 */
export async function mailTransition(
	db: Db,
	viewer: Viewer,
	actorName: string,
	d: Dataset & { organisationName: string },
	name: TransitionName,
	comment: string | null
): Promise<void> {
	try {
		const to = await transitionRecipients(db, viewer, d, name);
		const url = `${config().ORIGIN ?? 'http://127.0.0.1:3000'}/datasets/${d.id}`;
		const content = mailTemplates.datasetTransition(
			d,
			{ actorName, past: PAST[name], comment },
			url
		);
		await Promise.all(to.map((r) => sendMail({ to: r.email, ...content })));
	} catch (err) {
		console.error(`[mail] could not send the ${name} notice for dataset ${d.id}`, err);
	}
}
