import nodemailer, { type Transporter } from 'nodemailer';

export interface SmtpSettings {
	url?: string;
	host?: string;
	port?: number;
	secure?: boolean;
	user?: string;
	password?: string;
}

/** An SMTP transport from a URL (smtp://host:port) or from host, port and credentials. */
export function createMailTransport(s: SmtpSettings): Transporter {
	if (s.url) return nodemailer.createTransport(s.url);
	return nodemailer.createTransport({
		host: s.host,
		port: s.port ?? 587,
		secure: s.secure ?? false,
		auth: s.user ? { user: s.user, pass: s.password ?? '' } : undefined
	});
}
