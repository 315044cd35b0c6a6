// HTML for the local inbox's pages. Plain and self-contained: no scripts, no outside requests.
import type { StoredMessage } from './server.ts';

export function escapeHtml(text: string): string {
	return text.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

const style = `
	body { font: 15px/1.5 system-ui, sans-serif; background: #f7f1e3; color: #23201b; margin: 0; }
	main { max-width: 60rem; margin: 0 auto; padding: 2rem 1.5rem; }
	h1 { font-size: 1.4rem; } a { color: #87611d; }
	table { width: 100%; border-collapse: collapse; background: #fffdf7; }
	th, td { text-align: left; padding: .5rem .75rem; border-bottom: 1px solid #ddd0b4; vertical-align: top; }
	th { font-size: .8rem; text-transform: uppercase; letter-spacing: .05em; color: #7a7163; }
	pre { white-space: pre-wrap; background: #fffdf7; padding: 1rem; border: 1px solid #ddd0b4; }
	iframe { width: 100%; height: 28rem; border: 1px solid #ddd0b4; background: white; }
	.note { color: #7a7163; font-size: .85rem; }
`;

function page(title: string, body: string): string {
	return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>${escapeHtml(title)}</title><style>${style}</style></head><body><main>${body}</main></body></html>`;
}

export function renderList(messages: StoredMessage[]): string {
	const rows = messages
		.map(
			(m) => `<tr><td>${escapeHtml(m.receivedAt.replace('T', ' ').slice(0, 19))}</td>
			<td>${escapeHtml(m.to)}</td>
			<td><a href="/messages/${m.id}">${escapeHtml(m.subject)}</a></td>
			<td>${m.attachments.length || ''}</td></tr>`
		)
		.join('');
	return page(
		'Local inbox',
		`<h1>Local inbox</h1>
		<p class="note">Every e-mail the app sends in development lands here; nothing leaves this machine.
		Newest first; kept in memory until the inbox stops.</p>
		${
			messages.length
				? `<table><thead><tr><th>Received (UTC)</th><th>To</th><th>Subject</th><th>Files</th></tr></thead><tbody>${rows}</tbody></table>`
				: '<p>No messages yet.</p>'
		}`
	);
}

export function renderMessage(m: StoredMessage): string {
	const attachments = m.attachments
		.map(
			(a, i) =>
				`<li><a href="/messages/${m.id}/attachments/${i}">${escapeHtml(a.filename)}</a> <span class="note">${escapeHtml(a.contentType)}, ${a.size} bytes</span></li>`
		)
		.join('');
	return page(
		m.subject,
		`<p><a href="/">← All messages</a></p>
		<h1>${escapeHtml(m.subject)}</h1>
		<table>
			<tr><th>From</th><td>${escapeHtml(m.from)}</td></tr>
			<tr><th>To</th><td>${escapeHtml(m.to)}</td></tr>
			<tr><th>Received</th><td>${escapeHtml(m.receivedAt)}</td></tr>
		</table>
		${attachments ? `<h2>Attachments</h2><ul>${attachments}</ul>` : ''}
		${m.html ? `<h2>HTML</h2><iframe sandbox src="/messages/${m.id}/html" title="HTML body"></iframe>` : ''}
		<h2>Plain text</h2><pre>${escapeHtml(m.text)}</pre>`
	);
}
