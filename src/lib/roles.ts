/** The five roles of Cornicle, in the order the navigation lists them. */
export const ROLES = ['admin', 'agronomist', 'scout', 'grower', 'regional'] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
	admin: 'Administrator',
	agronomist: 'Agronomist',
	scout: 'Scout',
	grower: 'Grower',
	regional: 'Regional coordinator'
};

/** Where each role lands after signing in. */
export const HOME_BY_ROLE: Record<Role, string> = {
	admin: '/desk',
	agronomist: '/desk',
	scout: '/rounds',
	grower: '/my-farms',
	regional: '/region'
};
