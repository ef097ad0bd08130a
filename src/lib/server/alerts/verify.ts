import twilio from 'twilio';
import type { AlertSettings } from './settings';

/**
 * Reads a provider webhook: the form parameters, and whether X-Twilio-Signature matches them
 * and the URL the provider was given (our public base URL plus path and query), checked with
 * the SDK's own `validateRequest`.
 */
export async function readSignedForm(request: Request, url: URL, s: AlertSettings) {
	const params: Record<string, string> = {};
	const type = request.headers.get('content-type') ?? '';
	if (type.includes('application/x-www-form-urlencoded')) {
		for (const [k, v] of new URLSearchParams(await request.text())) params[k] = v;
	}
	const signature = request.headers.get('x-twilio-signature') ?? '';
	const full = new URL(url.pathname + url.search, s.PUBLIC_BASE_URL).href;
	const valid = !!signature && twilio.validateRequest(s.TWILIO_AUTH_TOKEN, signature, full, params);
	return { params, valid };
}
