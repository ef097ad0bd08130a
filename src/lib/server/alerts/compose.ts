import { CAUTION_SMS, CAUTION_SMS_SHORT } from '../../cautions';
import { DECISION_LABELS, type Decision } from '../../domain';
import type { Assessment, LevelKey } from '../../engine';
import { assessmentFigures, type Figure } from './figures';
import { mailHtml, mailText, type MailParts } from './html';

export const LEVEL_LABEL: Record<LevelKey, string> = {
	calm: 'Calm',
	stirring: 'Stirring',
	action: 'Action due',
	severe: 'Severe'
};

export interface Composed {
	sms: string;
	subject: string;
	text: string;
	html: string;
}

export interface TreatInfo {
	product: string | null;
	iracGroup: string | null;
	reiHours: number | null;
	phiDays: number | null;
	targetDate: string | null;
}

/** The first sentence of a reason, cut to fit an SMS. */
export function oneLine(s: string, max = 110) {
	const first = s
		.split(/(?<=[.;])\s/)[0]
		.replace(/\s+/g, ' ')
		.trim()
		.replace(/[.;]$/, '');
	return first.length > max ? first.slice(0, max - 1).trimEnd() + '…' : first;
}

function treatFigures(t: TreatInfo): Figure[] {
	const f: Figure[] = [];
	if (t.product)
		f.push(['Product', `${t.product}${t.iracGroup ? ` (IRAC group ${t.iracGroup})` : ''}`]);
	if (t.reiHours !== null) f.push(['Re-entry interval (REI)', `${t.reiHours} h`]);
	if (t.phiDays !== null) f.push(['Pre-harvest interval (PHI)', `${t.phiDays} days`]);
	if (t.targetDate) f.push(['Apply by', t.targetDate]);
	return f;
}

function finish(sms: string, subject: string, parts: MailParts): Composed {
	return { sms, subject, text: mailText(parts), html: mailHtml(parts) };
}

export interface LevelMessageInput {
	block: string;
	farm: string;
	from: LevelKey | null;
	assessment: Assessment;
	link: string;
	settingsUrl: string;
	/** An open treat recommendation on the block, if any: its cautions travel with the alert. */
	treat: TreatInfo | null;
}

/** SMS and e-mail for a block whose level rose. */
export function levelMessage(i: LevelMessageInput): Composed {
	const label = LEVEL_LABEL[i.assessment.level];
	const sms = [
		`Cornicle: ${i.block} (${i.farm}) is now ${label}.`,
		`${oneLine(i.assessment.reason)}.`,
		i.treat ? CAUTION_SMS : '',
		i.link
	]
		.filter(Boolean)
		.join(' ');
	const figures = assessmentFigures(i.assessment);
	const sections = i.treat
		? [
				{
					title: 'Open treat recommendation',
					lines: treatFigures(i.treat).map(([k, v]) => `${k}: ${v}`)
				}
			]
		: [];
	return finish(sms, `${label}: ${i.block} (${i.farm})`, {
		heading: `${i.block} on ${i.farm} is now ${label}`,
		intro: [
			`The level moved from ${i.from ? LEVEL_LABEL[i.from] : 'not yet assessed'} to ${label} (as of ${i.assessment.asOf}).`,
			`Why: ${i.assessment.reason}`
		],
		figures,
		sections,
		link: { href: i.link, label: 'Open the block in Cornicle' },
		cautions: !!i.treat,
		settingsUrl: i.settingsUrl
	});
}

export interface RecommendationMessageInput {
	block: string;
	farm: string;
	decision: Decision;
	author: string;
	notes: string | null;
	rescoutBy: string | null;
	warnings: string[];
	treat: TreatInfo | null;
	/** The block's latest stored assessment (stored without its per-visit series). */
	assessment: Omit<Assessment, 'perVisit'> | null;
	link: string;
	settingsUrl: string;
	/** Replies to the SMS acknowledge it. */
	smsAck: boolean;
}

/** SMS and e-mail for an issued recommendation. */
export function recommendationMessage(i: RecommendationMessageInput): Composed {
	const decision = DECISION_LABELS[i.decision];
	const what =
		i.decision === 'treat' && i.treat?.product
			? `${decision} with ${i.treat.product}${i.treat.targetDate ? ` by ${i.treat.targetDate}` : ''}`
			: i.decision === 'rescout' && i.rescoutBy
				? `Re-scout by ${i.rescoutBy}`
				: decision;
	const isTreat = i.decision === 'treat';
	// Every recommendation SMS ends with a caution line: the longer one when a product is named.
	const sms = [
		`Cornicle: recommendation for ${i.block} (${i.farm}): ${what}.`,
		i.smsAck ? 'Reply OK to acknowledge.' : '',
		i.link,
		isTreat ? CAUTION_SMS : CAUTION_SMS_SHORT
	]
		.filter(Boolean)
		.join(' ');
	const lines = [`Decision: ${what}`, `From: ${i.author}`];
	if (i.notes) lines.push(`Notes: ${i.notes}`);
	if (isTreat && i.treat) lines.push(...treatFigures(i.treat).map(([k, v]) => `${k}: ${v}`));
	for (const w of i.warnings) lines.push(`Check: ${w}`);
	return finish(sms, `Recommendation: ${what} — ${i.block} (${i.farm})`, {
		heading: `Recommendation for ${i.block} on ${i.farm}`,
		intro: [
			`${i.author} issued a recommendation: ${what}.`,
			i.assessment
				? `Current level: ${LEVEL_LABEL[i.assessment.level]}. ${i.assessment.reason}`
				: ''
		].filter(Boolean),
		figures: i.assessment ? assessmentFigures(i.assessment) : [],
		sections: [{ title: 'The recommendation', lines }],
		link: { href: i.link, label: 'Open the recommendation in Cornicle' },
		// Every recommendation, treat or not, carries the cautions and defers to the label.
		cautions: true,
		settingsUrl: i.settingsUrl
	});
}
