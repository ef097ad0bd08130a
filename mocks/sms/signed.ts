import twilio from 'twilio';

export interface PostResult {
	status: number;
	body: string;
	error?: string;
}

/**
 * POSTs form parameters to a webhook URL signed as the provider documents: X-Twilio-Signature
 * is the base64 HMAC-SHA1 of the full URL followed by each sorted parameter name and value,
 * keyed with the account's auth token (computed with the SDK's own helper).
 */
export async function postSigned(
	url: string,
	params: Record<string, string>,
	authToken: string
): Promise<PostResult> {
	const signature = twilio.getExpectedTwilioSignature(authToken, url, params);
	try {
		const res = await fetch(url, {
			method: 'POST',
			headers: {
				'content-type': 'application/x-www-form-urlencoded',
				'x-twilio-signature': signature,
				'user-agent': 'TwilioProxy/1.1 (cornicle sms fake)'
			},
			body: new URLSearchParams(params),
			signal: AbortSignal.timeout(15_000)
		});
		return { status: res.status, body: await res.text() };
	} catch (e) {
		return { status: 0, body: '', error: (e as Error).message };
	}
}
