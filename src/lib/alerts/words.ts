import type { Channel, NotificationStatus } from '$lib/domain';

/** A word and a one-line explanation for each delivery state of an outbox message. */
export const STATUS_WORDS: Record<NotificationStatus, { word: string; hint: string }> = {
	pending: { word: 'Queued', hint: 'Waiting for the next send (or for quiet hours to end)' },
	sending: { word: 'Going out', hint: 'A worker is handing it to the provider now' },
	sent: { word: 'Sent', hint: 'Accepted by the provider; no delivery report yet' },
	delivered: { word: 'Delivered', hint: 'The carrier reported it reached the phone' },
	failed: { word: 'Gave up', hint: 'Refused, or every retry failed; see the last error' },
	undelivered: { word: 'Bounced', hint: 'Accepted, but the carrier could not deliver it' },
	suppressed: { word: 'Held back', hint: 'Not sent: the number replied STOP' }
};

/** Tailwind classes for each state's chip; the word carries the meaning, colour only helps. */
export const STATUS_TONE: Record<NotificationStatus, string> = {
	pending: 'border-honey-300 bg-honey-50 text-honey-900',
	sending: 'border-honey-300 bg-honey-50 text-honey-900',
	sent: 'border-sap-200 bg-white text-sap-900',
	delivered: 'border-sap-300 bg-sap-50 text-sap-900',
	failed: 'border-red-300 bg-red-50 text-red-800',
	undelivered: 'border-red-300 bg-red-50 text-red-800',
	suppressed: 'border-soil-300 bg-soil-100 text-soil-800'
};

export const CHANNEL_WORDS: Record<Channel, string> = { sms: 'Text message', email: 'E-mail' };

/** The kinds of message the outbox holds, as written by the alert producers. */
export const ALERT_KINDS = [
	'level-severe',
	'level-action',
	'level-stirring',
	'level-calm',
	'recommendation',
	'scouting-overdue',
	'digest'
] as const;
export type AlertKind = (typeof ALERT_KINDS)[number];

export const KIND_WORDS: Record<AlertKind, string> = {
	'level-severe': 'Level: severe',
	'level-action': 'Level: action due',
	'level-stirring': 'Level: stirring',
	'level-calm': 'Level: calm',
	recommendation: 'Recommendation',
	'scouting-overdue': 'Scouting late',
	digest: 'Daily digest'
};

export function kindWord(kind: string) {
	return (KIND_WORDS as Record<string, string>)[kind] ?? kind;
}
