import nodemailer, { type Transporter } from 'nodemailer';
import { config } from '../config';

// The only module that sends mail: nodemailer over SMTP. Features never call it directly;
// they queue a row in the outbox and the outbox worker delivers it through here.

let transporter: Transporter | undefined;

function transport(): Transporter {
	if (!transporter) {
		const c = config();
		transporter = nodemailer.createTransport({
			host: c.SMTP_HOST,
			port: c.SMTP_PORT,
			secure: false,
			// The local fake offers no TLS; a hosted relay would be configured with it.
			ignoreTLS: true,
			connectionTimeout: 5000,
			greetingTimeout: 5000,
			socketTimeout: 10000
		});
	}
	return transporter;
}

export interface OutgoingMail {
	to: string;
	subject: string;
	text: string;
	html?: string | null;
}

export async function deliver(mail: OutgoingMail): Promise<void> {
	await transport().sendMail({
		from: config().MAIL_FROM,
		to: mail.to,
		subject: mail.subject,
		text: mail.text,
		html: mail.html ?? undefined
	});
}

export async function mailHealthy(): Promise<boolean> {
	try {
		await transport().verify();
		return true;
	} catch {
		return false;
	}
}
