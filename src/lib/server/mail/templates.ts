// Our own wording for every message Pincer sends: plain text and a simple HTML twin.
import type { Mail } from './index';

const escape = (text: string) => text.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

function layout(
	title: string,
	paragraphs: string[],
	action?: { label: string; url: string }
): string {
	const body = paragraphs.map((p) => `<p style="margin:0 0 14px">${escape(p)}</p>`).join('');
	const button = action
		? `<p style="margin:22px 0"><a href="${escape(action.url)}" style="background:#a87b2c;color:#f7f1e3;padding:10px 18px;border-radius:6px;text-decoration:none;font-weight:600">${escape(action.label)}</a></p><p style="font-size:12px;color:#7a7163">Or paste this address into your browser: ${escape(action.url)}</p>`
		: '';
	return `<!doctype html><html><body style="background:#f7f1e3;color:#23201b;font:15px/1.5 system-ui,sans-serif;padding:24px"><div style="max-width:560px;margin:auto;background:#fffdf7;border:1px solid #ddd0b4;border-radius:8px;padding:24px"><h1 style="font-size:18px;margin:0 0 16px">${escape(title)}</h1>${body}${button}<p style="font-size:12px;color:#7a7163;margin-top:24px">Sent by Pincer. If you did not expect this message you can ignore it.</p></div></body></html>`;
}

function plain(paragraphs: string[], action?: { label: string; url: string }): string {
	const lines = [...paragraphs];
	if (action) lines.push(`${action.label}: ${action.url}`);
	lines.push('', 'Sent by Pincer. If you did not expect this message you can ignore it.');
	return lines.join('\n\n');
}

function message(
	to: string,
	subject: string,
	paragraphs: string[],
	action?: { label: string; url: string }
): Mail {
	return {
		to,
		subject,
		text: plain(paragraphs, action),
		html: layout(subject, paragraphs, action)
	};
}

export function signInLinkMail(to: string, url: string, expiresMinutes: number): Mail {
	return message(
		to,
		'Your Pincer sign-in link',
		[
			'Someone (we hope you) asked to sign in to Pincer with this address.',
			`The link works once and for ${expiresMinutes} minutes.`
		],
		{ label: 'Sign in to Pincer', url }
	);
}

export function passwordResetMail(to: string, url: string): Mail {
	return message(
		to,
		'Choose a new Pincer password',
		[
			'A new password was requested for your Pincer account.',
			'The link works once and for 30 minutes. Your current password keeps working until you choose a new one.'
		],
		{ label: 'Choose a new password', url }
	);
}

export function invitationMail(
	to: string,
	url: string,
	details: { workspace: string; role: string; invitedBy: string }
): Mail {
	return message(
		to,
		`You are invited to ${details.workspace} on Pincer`,
		[
			`${details.invitedBy} invited you to join ${details.workspace} as ${details.role}.`,
			'The invitation works once and for 7 days.'
		],
		{ label: 'Accept the invitation', url }
	);
}
