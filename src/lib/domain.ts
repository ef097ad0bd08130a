/** Shared vocabularies of the data model, used by models, schemas and screens. */
export const LEVEL_KEYS = ['calm', 'stirring', 'action', 'severe'] as const;
export const PROVENANCE = [
	'published',
	'computed',
	'from memory',
	'common practice',
	'assumption'
] as const;
export const TRAP_KINDS = ['yellow-sticky', 'water-pan', 'suction'] as const;
export type TrapKind = (typeof TRAP_KINDS)[number];

export const DECISIONS = ['treat', 'rescout', 'no-action', 'biological', 'other'] as const;
export type Decision = (typeof DECISIONS)[number];
export const DECISION_LABELS: Record<Decision, string> = {
	treat: 'Treat',
	rescout: 'Re-scout',
	'no-action': 'No action',
	biological: 'Biological control',
	other: 'Other measure'
};

export const RECOMMENDATION_STATUSES = [
	'draft',
	'issued',
	'acknowledged',
	'applied',
	'withdrawn'
] as const;
export type RecommendationStatus = (typeof RECOMMENDATION_STATUSES)[number];

export interface RecommendationWarning {
	code: 'phi-past-harvest' | 'irac-repeat' | 'bloom-pollinators' | 'rei' | 'other';
	message: string;
}

export const CHANNELS = ['sms', 'email'] as const;
export type Channel = (typeof CHANNELS)[number];
export const NOTIFICATION_STATUSES = [
	'pending',
	'sending',
	'sent',
	'delivered',
	'failed',
	'undelivered',
	'suppressed'
] as const;
export type NotificationStatus = (typeof NOTIFICATION_STATUSES)[number];
