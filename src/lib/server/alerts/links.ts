import type { Role } from '../../roles';
import type { AlertSettings } from './settings';

/** Where an alert about a block sends each role: the block page, or a scout's rounds. */
export function blockLink(s: AlertSettings, role: Role, blockId: number) {
	const path =
		role === 'scout' ? '/rounds' : role === 'regional' ? '/region' : `/blocks/${blockId}`;
	return new URL(path, s.PUBLIC_BASE_URL).href;
}

export function settingsLink(s: AlertSettings) {
	return new URL('/settings', s.PUBLIC_BASE_URL).href;
}
