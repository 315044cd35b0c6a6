import { env } from '$env/dynamic/private';
import nodemailer, { type Transporter } from 'nodemailer';
import type { Attachment } from 'nodemailer/lib/mailer';

let transporter: Transporter | undefined;

function transport(): Transporter {
	// SMTP_URL points at the local inbox in development and tests; a real provider is configuration only.
	transporter ??= nodemailer.createTransport(env.SMTP_URL || 'smtp://127.0.0.1:2525');
	return transporter;
}

export type Mail = {
	to: string;
	subject: string;
	text: string;
	html: string;
	attachments?: Attachment[];
};

export async function sendMail(mail: Mail): Promise<void> {
	await transport().sendMail({
		from: env.MAIL_FROM || 'Pincer <no-reply@pincer.localhost>',
		...mail
	});
}
