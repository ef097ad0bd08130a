import { error, json } from '@sveltejs/kit';
import twilio from 'twilio';
import { db } from '$lib/server/db';
import { handleInbound, inboundSchema } from '$lib/server/alerts/inbound';
import { currentSettings } from '$lib/server/alerts/settings';
import { readSignedForm } from '$lib/server/alerts/verify';
import type { RequestHandler } from './$types';

// Public (no session): the SMS provider posts replies here. The signature is the guard.
export const POST: RequestHandler = async ({ request, url }) => {
	const s = currentSettings();
	const { params, valid } = await readSignedForm(request, url, s);
	if (!valid) error(403, 'Signature missing or wrong.');
	const msg = inboundSchema.safeParse(params);
	if (!msg.success) {
		return json(
			{
				message: 'Bad inbound message.',
				issues: msg.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message }))
			},
			{ status: 400 }
		);
	}
	const reply = await handleInbound(db(), s, msg.data);
	const twiml = new twilio.twiml.MessagingResponse();
	if (reply) twiml.message(reply);
	return new Response(twiml.toString(), { headers: { 'content-type': 'text/xml' } });
};
