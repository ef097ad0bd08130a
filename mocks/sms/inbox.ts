import type { SmsStore } from './store';

const esc = (s: string) =>
	s.replace(
		/[&<>"']/g,
		(c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!
	);

function shell(title: string, body: string) {
	return `<!doctype html><html lang="en"><head><meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1"><title>${esc(title)}</title>
<style>body{font:15px/1.4 system-ui,sans-serif;margin:0 auto;max-width:40rem;padding:1rem;color:#2b2620}
a{color:#3f6b3a}li{margin:.3rem 0}.m{border-radius:.8rem;padding:.5rem .75rem;margin:.4rem 0;max-width:85%;white-space:pre-wrap}
.in{background:#e9e4da}.out{background:#dfeadb;margin-left:auto}.meta{font-size:12px;color:#6b6358}</style></head>
<body>${body}</body></html>`;
}

/** Numbers that have messages, newest first. */
export function inboxPage(store: SmsStore) {
	const rows = store
		.numbers()
		.map(
			(n) =>
				`<li><a href="/phone/${encodeURIComponent(n.number)}">${esc(n.number)}</a> <span class="meta">${n.count} message(s)</span></li>`
		)
		.join('');
	return shell(
		'SMS fake inbox',
		`<h1>SMS fake: phones</h1>${rows ? `<ul>${rows}</ul>` : '<p>No messages yet.</p>'}`
	);
}

/** One phone's conversation, oldest first, with each message's delivery state. */
export function phonePage(store: SmsStore, number: string) {
	const msgs = store.list({ number }).reverse();
	const items = msgs
		.map((m) => {
			const mine = m.direction === 'inbound';
			return `<div class="m ${mine ? 'in' : 'out'}">${esc(m.body)}<div class="meta">${esc(m.status)}${m.errorCode ? ` (${m.errorCode})` : ''} · ${m.dateCreated.toISOString()} · ${esc(m.sid)}</div></div>`;
		})
		.join('');
	return shell(
		`SMS fake: ${number}`,
		`<p><a href="/">All phones</a></p><h1>${esc(number)}</h1>${items || '<p>No messages.</p>'}`
	);
}
