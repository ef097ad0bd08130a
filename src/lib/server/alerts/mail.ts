import nodemailer, { type Transporter } from 'nodemailer';
import type { AlertSettings } from './settings';

/**
 * A pooled SMTP transport on SMTP_URL (the local mail fake, or a real relay). Pool settings go
 * into the URL's query, which nodemailer reads as options; settings already there win.
 */
export function mailTransport(s: AlertSettings): Transporter {
	const u = new URL(s.SMTP_URL);
	const t = String(s.ALERTS_SEND_TIMEOUT_MS);
	const defaults: Record<string, string> = {
		pool: 'true',
		maxConnections: '8',
		maxMessages: '1000',
		connectionTimeout: t,
		greetingTimeout: t,
		socketTimeout: t
	};
	for (const [k, v] of Object.entries(defaults))
		if (!u.searchParams.has(k)) u.searchParams.set(k, v);
	return nodemailer.createTransport(u.href);
}
