import type { IncomingMessage, ServerResponse } from 'node:http';
import type { MailStore, StoredMail } from './store';

const esc = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

const page = (title: string, body: string) => `<!doctype html><html lang="en"><head>
<meta charset="utf-8"><meta name="viewport" content="width=device-width,initial-scale=1">
<title>${esc(title)}</title><style>
body{font:15px/1.45 system-ui,sans-serif;margin:0;background:#f8f6f3;color:#2a211b}
header{background:#245a3f;color:#fff;padding:.8rem 1rem;font-weight:600}
main{max-width:900px;margin:0 auto;padding:1rem}
a{color:#245a3f}.m{display:block;padding:.7rem;border-bottom:1px solid #ddd4c6;text-decoration:none;color:inherit}
.m:hover{background:#eeeae3}.s{font-weight:600}.meta{color:#755f4b;font-size:13px}
pre{white-space:pre-wrap;background:#fff;padding:1rem;border:1px solid #ddd4c6}
iframe{width:100%;height:60vh;border:1px solid #ddd4c6;background:#fff}
</style></head><body><header>Cornicle test mail inbox (local fake, nothing leaves this machine)</header><main>${body}</main></body></html>`;

function listHtml(messages: StoredMail[]) {
	if (!messages.length) return page('Inbox', '<p>No mail yet.</p>');
	const rows = messages
		.map(
			(m) =>
				`<a class="m" href="/messages/${m.id}"><div class="s">${esc(m.subject || '(no subject)')}</div>` +
				`<div class="meta">to ${esc(m.to.join(', '))} · ${esc(m.receivedAt)}</div></a>`
		)
		.join('');
	return page('Inbox', `<h1>Inbox (${messages.length})</h1>${rows}`);
}

function messageHtml(m: StoredMail) {
	const html = m.html
		? `<h2>HTML part</h2><iframe sandbox title="HTML part" srcdoc="${esc(m.html)}"></iframe>`
		: '';
	return page(
		m.subject,
		`<p><a href="/">← Inbox</a></p><h1>${esc(m.subject)}</h1>
<p class="meta">From ${esc(m.from)}<br>To ${esc(m.to.join(', '))}<br>${esc(m.receivedAt)}</p>
${html}<h2>Text part</h2><pre>${esc(m.text)}</pre>`
	);
}

/** The inbox's HTTP handler: a page per message for people, JSON under /api for tests. */
export function inboxHandler(store: MailStore) {
	return (req: IncomingMessage, res: ServerResponse) => {
		const url = new URL(req.url ?? '/', 'http://localhost');
		const json = (status: number, body: unknown) => {
			res.writeHead(status, { 'content-type': 'application/json' });
			res.end(JSON.stringify(body));
		};
		const html = (status: number, body: string) => {
			res.writeHead(status, { 'content-type': 'text/html; charset=utf-8' });
			res.end(body);
		};
		const one = url.pathname.match(/^\/(api\/)?messages\/(\d+)$/);
		if (url.pathname === '/api/messages' && req.method === 'GET') {
			return json(200, store.list(url.searchParams.get('to') ?? undefined));
		}
		if (url.pathname === '/api/messages' && req.method === 'DELETE') {
			store.clear();
			return json(200, { cleared: true });
		}
		if (one) {
			const m = store.get(Number(one[2]));
			if (!m)
				return one[1]
					? json(404, { error: 'not found' })
					: html(404, page('Not found', '<p>No such message.</p>'));
			return one[1] ? json(200, m) : html(200, messageHtml(m));
		}
		if (url.pathname === '/')
			return html(200, listHtml(store.list(url.searchParams.get('to') ?? undefined)));
		return html(404, page('Not found', '<p>Not found.</p>'));
	};
}
