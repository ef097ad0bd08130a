import type { Role } from './roles';

export interface NavItem {
	href: string;
	label: string;
	roles: Role[];
}

/** The navigation; each role sees only what it may use (the server checks again). */
export const NAV: NavItem[] = [
	{ href: '/desk', label: 'Desk', roles: ['agronomist', 'admin'] },
	{ href: '/rounds', label: 'My rounds', roles: ['scout'] },
	{ href: '/rounds/outbox', label: 'Outbox', roles: ['scout'] },
	{ href: '/assignments', label: 'Assignments', roles: ['agronomist', 'admin'] },
	{ href: '/traps', label: 'Traps', roles: ['agronomist', 'admin', 'scout'] },
	{ href: '/weather', label: 'Weather', roles: ['agronomist', 'admin', 'scout'] },
	{ href: '/import', label: 'Import', roles: ['agronomist', 'admin'] },
	{ href: '/my-farms', label: 'My farms', roles: ['grower'] },
	{ href: '/map', label: 'Map', roles: ['agronomist', 'admin', 'scout', 'grower'] },
	{ href: '/recommendations', label: 'Advice', roles: ['agronomist', 'admin'] },
	{ href: '/library/products', label: 'Library', roles: ['agronomist', 'admin'] },
	{ href: '/audit', label: 'Audit', roles: ['agronomist', 'admin'] },
	{ href: '/alerts', label: 'Alert log', roles: ['agronomist', 'admin'] },
	{ href: '/region', label: 'Region', roles: ['regional'] },
	{ href: '/admin/people', label: 'People', roles: ['admin'] },
	{ href: '/settings', label: 'My alerts', roles: ['admin', 'agronomist', 'scout', 'grower'] }
];

export function navFor(role: Role) {
	return NAV.filter((n) => n.roles.includes(role));
}
