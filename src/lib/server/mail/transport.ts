import nodemailer, { type Transporter } from 'nodemailer';
import { config } from '../config';

// The only module that sends mail: nodemailer over SMTP. Features never call it directly;
// they queue a row in the outbox and the outbox worker delivers it through here.

export interface SmtpSettings {
	host: string;
	port: number;
	from: string;
}

export interface OutgoingMail {
	to: string;
	subject: string;
	text: string;
	html?: string | null;
	/** The outbox row's id: becomes the Message-ID, so a resent copy can be recognised. */
	id?: string;
}

/** Sends one mail; rejects when the SMTP server refuses it or cannot be reached. */
export type SendMail = (mail: OutgoingMail) => Promise<void>;

function createTransporter(settings: SmtpSettings): Transporter {
	return nodemailer.createTransport({
		host: settings.host,
		port: settings.port,
		secure: false,
		// The local fake offers no TLS; a hosted relay would be configured with it.
		ignoreTLS: true,
		connectionTimeout: 5000,
		greetingTimeout: 5000,
		socketTimeout: 10000
	});
}

function sender(transporter: Transporter, from: string): SendMail {
	return async (mail) => {
		await transporter.sendMail({
			from,
			to: mail.to,
			subject: mail.subject,
			text: mail.text,
			html: mail.html ?? undefined,
			...(mail.id ? { messageId: `<${mail.id}@outbox.seamwell.invalid>` } : {})
		});
	};
}

/** A sender for a chosen SMTP server (tests point one at a mail fake of their own). */
export function createSmtpSender(settings: SmtpSettings): SendMail {
	return sender(createTransporter(settings), settings.from);
}

let transporter: Transporter | undefined;

function transport(): Transporter {
	if (!transporter) {
		const c = config();
		transporter = createTransporter({ host: c.SMTP_HOST, port: c.SMTP_PORT, from: c.MAIL_FROM });
	}
	return transporter;
}

/** Sends through the configured SMTP server (SMTP_HOST, SMTP_PORT, MAIL_FROM). */
export async function deliver(mail: OutgoingMail): Promise<void> {
	await sender(transport(), config().MAIL_FROM)(mail);
}

export async function mailHealthy(): Promise<boolean> {
	try {
		await transport().verify();
		return true;
	} catch {
		return false;
	}
}
