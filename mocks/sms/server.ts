// Local stand-in for the SMS provider: its REST Messages API (as the twilio SDK calls it),
// signed status callbacks, inbound texts to the app, a control API for tests and a web inbox.
// Started by `npm start` and `npm test`; the app reaches it only through TWILIO_BASE_URL.
import { createServer } from 'node:http';
import { smsFake } from './api';

const port = Number(process.env.SMS_FAKE_PORT ?? 8026);
const publicBase = process.env.PUBLIC_BASE_URL ?? 'http://127.0.0.1:3000';
const handler = smsFake({
	accountSid: process.env.TWILIO_ACCOUNT_SID ?? 'AC00000000000000000000000000000001',
	authToken: process.env.TWILIO_AUTH_TOKEN ?? 'fake-auth-token-for-local-use',
	from: process.env.TWILIO_FROM ?? '+15005550006',
	inboundUrl: process.env.SMS_INBOUND_URL ?? `${publicBase}/api/webhooks/sms/inbound`
});

const server = createServer((req, res) => void handler(req, res));
server.keepAliveTimeout = 30_000;
server.listen(port, '127.0.0.1', () => {
	console.log(`sms fake: REST API and inbox on http://127.0.0.1:${port}`);
});

for (const sig of ['SIGINT', 'SIGTERM'] as const) {
	process.on(sig, () => {
		server.close(() => process.exit(0));
		server.closeAllConnections();
	});
}
