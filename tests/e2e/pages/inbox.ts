import { inject } from 'vitest';

type Message = {
	id: number;
	subject: string;
	text: string;
	html: string | null;
	envelopeTo: string[];
	attachments: { filename: string; url: string }[];
};

/** Waits for the newest message to an address in the local inbox whose subject matches. */
export async function waitForMail(
	to: string,
	subject: RegExp,
	timeoutMs = 10_000
): Promise<Message> {
	const deadline = Date.now() + timeoutMs;
	while (Date.now() < deadline) {
		const res = await fetch(`${inject('inboxURL')}/api/messages?to=${encodeURIComponent(to)}`);
		const messages = (await res.json()) as Message[];
		const found = messages.find((m) => subject.test(m.subject));
		if (found) return found;
		await new Promise((r) => setTimeout(r, 150));
	}
	throw new Error(`no message to ${to} matching ${subject} arrived`);
}

/** The first link in a message's plain text that starts with the app's address. */
export function linkIn(message: Message): string {
	const base = inject('baseURL');
	const match = message.text.match(
		new RegExp(`${base.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}\\S+`)
	);
	if (!match) throw new Error(`no link to the app in: ${message.text}`);
	return match[0];
}
