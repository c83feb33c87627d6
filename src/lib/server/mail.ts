import type { Transporter } from 'nodemailer';
import { config } from './config';
import { jobs } from './jobs/boss';
import { enqueueMail, workMailQueue, type OutgoingMail } from './jobs/mail-queue';
import { createMailTransport } from './mail-transport';

export type { OutgoingMail };

let transporter: Transporter | undefined;

/** The SMTP transport: the local mail catcher in development and tests, a relay in production. */
export function mailer(): Transporter {
	if (transporter) return transporter;
	const c = config();
	transporter = createMailTransport({
		url: c.SMTP_URL,
		host: c.SMTP_HOST,
		port: c.SMTP_PORT,
		secure: c.SMTP_SECURE === 'true',
		user: c.SMTP_USER,
		password: c.SMTP_PASSWORD
	});
	return transporter;
}

/** Queue one message (plain text and HTML, from MAIL_FROM); a worker delivers it, with retries. */
export async function sendMail(message: OutgoingMail): Promise<void> {
	await enqueueMail(await jobs(config().DATABASE_URL), message);
}

/** Hand one message to the SMTP server now (the mail queue's worker). */
export async function deliverMail(message: OutgoingMail): Promise<void> {
	await mailer().sendMail({ from: config().MAIL_FROM, ...message });
}

/** Start delivering queued mail in this process. */
export async function startMailWorker(): Promise<void> {
	await workMailQueue(await jobs(config().DATABASE_URL), deliverMail);
}

/** Close pooled SMTP connections (called on shutdown). */
export function closeMailer(): void {
	transporter?.close();
	transporter = undefined;
}
