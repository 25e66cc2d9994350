// Outgoing e-mail over SMTP with nodemailer; in development and tests the SMTP peer is the
// local fake server started by the start and test commands (scripts/fake-smtp.ts).
import nodemailer, { type Transporter } from 'nodemailer';

export interface Mail {
	to: string;
	subject: string;
	text: string;
	html?: string;
}

let transport: Transporter | null = null;

function transporter(): Transporter {
	if (!transport) {
		const user = process.env.SMTP_USER;
		transport = nodemailer.createTransport({
			host: process.env.SMTP_HOST ?? '127.0.0.1',
			port: Number(process.env.SMTP_PORT ?? 2525),
			secure: process.env.SMTP_SECURE === 'true',
			// The local fake speaks plain SMTP on loopback; a real relay would use STARTTLS.
			ignoreTLS: (process.env.SMTP_HOST ?? '127.0.0.1') === '127.0.0.1',
			auth: user ? { user, pass: process.env.SMTP_PASS ?? '' } : undefined
		});
	}
	return transport;
}

export async function send(mail: Mail): Promise<void> {
	await transporter().sendMail({
		from: process.env.MAIL_FROM ?? 'Inchwarden <no-reply@inchwarden.test>',
		to: mail.to,
		subject: mail.subject,
		text: mail.text,
		html: mail.html
	});
}

export const mail = { send };
