import type { FakeMessage } from './store';

const rfc2822 = (d: Date | null) => (d ? d.toUTCString().replace('GMT', '+0000') : null);

/** A message as the provider's REST API represents it (snake_case, RFC 2822 dates). */
export function messageResource(m: FakeMessage) {
	const uri = `/2010-04-01/Accounts/${m.accountSid}/Messages/${m.sid}.json`;
	return {
		account_sid: m.accountSid,
		api_version: '2010-04-01',
		body: m.body,
		date_created: rfc2822(m.dateCreated),
		date_sent: rfc2822(m.dateSent),
		date_updated: rfc2822(m.dateUpdated),
		direction: m.direction,
		error_code: m.errorCode,
		error_message: m.errorMessage,
		from: m.from,
		messaging_service_sid: null,
		num_media: '0',
		num_segments: String(Math.max(1, Math.ceil(m.body.length / 153))),
		price: null,
		price_unit: 'USD',
		sid: m.sid,
		status: m.status,
		subresource_uris: { media: uri.replace('.json', '/Media.json') },
		to: m.to,
		uri
	};
}

/** The error body the provider answers with; the SDK turns it into a RestException. */
export function restError(status: number, code: number, message: string) {
	return {
		code,
		message,
		more_info: `https://www.twilio.com/docs/errors/${code}`,
		status
	};
}
