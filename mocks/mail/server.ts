// Local stand-in for a mail relay: SMTP on loopback plus a web inbox. Started by `npm start`
// and `npm test`; the app reaches it only through SMTP_URL, as it would a real relay.
import { createServer } from 'node:http';
import { SMTPServer } from 'smtp-server';
import { inboxHandler } from './inbox';
import { MailStore } from './store';

const smtpPort = Number(process.env.SMTP_PORT ?? 2525);
const inboxPort = Number(process.env.INBOX_PORT ?? 8025);
const store = new MailStore();

const smtp = new SMTPServer({
	authOptional: true,
	disabledCommands: ['STARTTLS'],
	logger: false,
	size: 10 * 1024 * 1024,
	onData(stream, session, callback) {
		const chunks: Buffer[] = [];
		stream.on('data', (c: Buffer) => chunks.push(c));
		stream.on('end', () => {
			const to = session.envelope.rcptTo.map((r) => r.address);
			store.add(Buffer.concat(chunks), to).then(
				() => callback(),
				(err: Error) => callback(err)
			);
		});
	}
});

smtp.listen(smtpPort, '127.0.0.1', () => {
	const http = createServer(inboxHandler(store));
	http.listen(inboxPort, '127.0.0.1', () => {
		console.log(`mail fake: SMTP 127.0.0.1:${smtpPort}, inbox http://127.0.0.1:${inboxPort}`);
	});
});

for (const sig of ['SIGINT', 'SIGTERM'] as const) {
	process.on(sig, () => smtp.close(() => process.exit(0)));
}
