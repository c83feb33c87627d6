import type PgBoss from 'pg-boss';
import type { Db } from '../db/client';
import type { OutgoingMail } from './mail-queue';
import { QUEUES, SCHEDULES } from './queues';
import { releaseDueEmbargoes } from '../repositories/embargo';
import { mailTemplates } from '../mail-templates';

/**
 * One release pass at `at` (the injectable clock: tests pass the release day, the schedule passes
 * now): releases the datasets whose embargo ended and mails their owners. Mail goes through
 * `send` (the mail queue in the app); trouble with it is logged and never undoes a release.
 */
export async function runEmbargoRelease(
	db: Db,
	at: Date,
	send: (m: OutgoingMail) => Promise<void>,
	origin: string
) {
	const released = await releaseDueEmbargoes(db, at);
	for (const d of released) {
		const content = mailTemplates.embargoReleased(d, `${origin}/datasets/${d.id}`);
		for (const r of d.notify) {
			await send({ to: r.email, ...content }).catch((err) =>
				console.error(`[mail] could not send the release notice for dataset ${d.id}`, err)
			);
		}
	}
	return released.map((d) => d.id);
}

/** Schedule the pass (hourly, so a release is at most an hour late) and take its jobs here. */
export async function startEmbargoRelease(
	boss: PgBoss,
	db: Db,
	send: (m: OutgoingMail) => Promise<void>,
	origin: string
) {
	await boss.schedule(QUEUES.embargoRelease.name, SCHEDULES.embargoRelease);
	await boss.work(QUEUES.embargoRelease.name, async () => {
		const ids = await runEmbargoRelease(db, new Date(), send, origin);
		if (ids.length) console.log(`embargo release: ${ids.length} dataset(s) made public`);
	});
}
