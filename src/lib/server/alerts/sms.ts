import twilio from 'twilio';
import type { AlertSettings } from './settings';

type RequestOptions<T> = Parameters<typeof twilio.RequestClient.prototype.request<T>>[0];

/**
 * Sends every REST call to another host (the local fake) keeping path and query; the SDK's
 * documented `httpClient` option, so only configuration differs from production.
 */
class RedirectingRequestClient extends twilio.RequestClient {
	constructor(
		private base: URL,
		timeout: number
	) {
		super({ timeout, keepAlive: true, maxSockets: 64 });
	}
	override request<T>(opts: RequestOptions<T>) {
		const u = new URL(opts.uri);
		u.protocol = this.base.protocol;
		u.host = this.base.host;
		return super.request<T>({ ...opts, uri: u.href });
	}
}

export type SmsClient = ReturnType<typeof twilio>;

/** The provider's SDK client, pointed at TWILIO_BASE_URL when that is set. */
export function smsClient(s: AlertSettings): SmsClient {
	const httpClient = s.TWILIO_BASE_URL
		? new RedirectingRequestClient(new URL(s.TWILIO_BASE_URL), s.ALERTS_SEND_TIMEOUT_MS)
		: new twilio.RequestClient({ timeout: s.ALERTS_SEND_TIMEOUT_MS, keepAlive: true });
	return twilio(s.TWILIO_ACCOUNT_SID, s.TWILIO_AUTH_TOKEN, { httpClient });
}

/** Provider error codes that no retry can fix (bad number, opted out, not SMS-capable). */
export const PERMANENT_SMS_CODES = new Set([21211, 21214, 21408, 21610, 21612, 21614, 21606]);

/** The status callback URL for one attempt at one outbox row. */
export function statusCallbackUrl(s: AlertSettings, id: number, attempt: number) {
	return new URL(`/api/webhooks/sms/status?n=${id}&a=${attempt}`, s.PUBLIC_BASE_URL).href;
}
