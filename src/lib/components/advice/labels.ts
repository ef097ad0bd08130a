import type { RecommendationStatus, RecommendationWarning } from '$lib/domain';

/** Cornicle's own names for the states of a recommendation. */
export const STATUS_LABELS: Record<RecommendationStatus, string> = {
	draft: 'Draft, not sent',
	issued: 'Sent, awaiting the grower',
	acknowledged: 'Read by the grower',
	applied: 'Carried out',
	withdrawn: 'Withdrawn'
};

export const WARNING_TITLES: Record<RecommendationWarning['code'], string> = {
	'phi-past-harvest': 'Harvest interval',
	'irac-repeat': 'Same mode of action again',
	'bloom-pollinators': 'Pollinators',
	rei: 'Re-entry',
	other: 'Check'
};
