import type { Role } from '../../roles';
import type { AlertSettings } from './settings';

const HOME: Record<Role, string> = {
	admin: '/desk',
	agronomist: '/desk',
	scout: '/rounds',
	grower: '/my-farms',
	regional: '/region'
};

/** Where an alert about a block sends each role (the page that role uses for blocks). */
export function blockLink(s: AlertSettings, role: Role, blockId: number) {
	return new URL(`${HOME[role]}?block=${blockId}`, s.PUBLIC_BASE_URL).href;
}

export function settingsLink(s: AlertSettings) {
	return new URL('/settings', s.PUBLIC_BASE_URL).href;
}
