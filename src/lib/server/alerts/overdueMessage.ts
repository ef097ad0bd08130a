import type { LevelKey } from '../../engine';
import { LEVEL_LABEL, type Composed } from './compose';
import type { Figure } from './figures';
import { mailHtml, mailText, type MailParts } from './html';

export interface OverdueMessageInput {
	block: string;
	farm: string;
	lastVisitOn: string;
	/** The day the re-scout (or the follow-up visit) fell due. */
	dueOn: string;
	overdueDays: number;
	intervalDays: number;
	followUpDue: string | null;
	level: LevelKey | null;
	link: string;
	settingsUrl: string;
}

/** SMS and e-mail for a block whose re-scout is past due. */
export function overdueMessage(i: OverdueMessageInput): Composed {
	const sms = `Cornicle: scouting of ${i.block} (${i.farm}) is overdue: last visit ${i.lastVisitOn}, due ${i.dueOn}. ${i.link}`;
	const figures: Figure[] = [
		['Last visit', i.lastVisitOn],
		['Re-scout interval', `every ${i.intervalDays} days`],
		['Visit due', i.dueOn],
		['Days overdue', String(i.overdueDays)]
	];
	if (i.followUpDue) figures.push(['Follow-up visit asked for by', i.followUpDue]);
	figures.push(['Current level', i.level ? LEVEL_LABEL[i.level] : 'not yet assessed']);
	const parts: MailParts = {
		heading: `${i.block} on ${i.farm} is due for scouting`,
		intro: [
			`A visit to ${i.block} was due ${i.dueOn}; none has been recorded since ${i.lastVisitOn}.`,
			'Its level rests on counts that are getting old; a visit brings it up to date.'
		],
		figures,
		link: { href: i.link, label: 'Open it in Cornicle' },
		cautions: false,
		settingsUrl: i.settingsUrl
	};
	return {
		sms,
		subject: `Scouting overdue: ${i.block} (${i.farm})`,
		text: mailText(parts),
		html: mailHtml(parts)
	};
}
