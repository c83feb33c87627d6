import type { Transporter } from 'nodemailer';
import { config } from './config';
import { createMailTransport } from './mail-transport';

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

export interface OutgoingMail {
	to: string;
	subject: string;
	text: string;
	html: string;
}

/** Send one message with a plain-text and an HTML part, from MAIL_FROM. */
export async function sendMail(message: OutgoingMail): Promise<void> {
	await mailer().sendMail({ from: config().MAIL_FROM, ...message });
}

/** Close pooled SMTP connections (called on shutdown). */
export function closeMailer(): void {
	transporter?.close();
	transporter = undefined;
}
