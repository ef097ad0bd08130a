import type { Role } from '../../../roles';
import { ROLE_LABELS } from '../../../roles';

/** Every demo account shares this password; it is printed by `npm start`. */
export const DEMO_PASSWORD = 'cornicle-demo';

export interface DemoPerson {
	key: string;
	name: string;
	email: string;
	role: Role;
	org: 'brackenridge' | 'ostrander' | 'extension';
	phone?: string;
	roleLabel: string;
}

const people: Omit<DemoPerson, 'roleLabel'>[] = [
	{
		key: 'admin',
		name: 'Ines Marwood',
		email: 'ines@brackenridge.test',
		role: 'admin',
		org: 'brackenridge'
	},
	{
		key: 'agronomist',
		name: 'Dana Okafor-Lind',
		email: 'dana@brackenridge.test',
		role: 'agronomist',
		org: 'brackenridge',
		phone: '+17015550141'
	},
	{
		key: 'scout1',
		name: 'Tomas Reyes-Hale',
		email: 'tomas@brackenridge.test',
		role: 'scout',
		org: 'brackenridge'
	},
	{
		key: 'scout2',
		name: 'Maeve Adebayo',
		email: 'maeve@brackenridge.test',
		role: 'scout',
		org: 'brackenridge'
	},
	{
		key: 'grower1',
		name: 'Harlan Voss',
		email: 'harlan@heronsbrook.test',
		role: 'grower',
		org: 'brackenridge',
		phone: '+17015550172'
	},
	{
		key: 'grower2',
		name: 'June Calloway',
		email: 'june@callowaybottoms.test',
		role: 'grower',
		org: 'brackenridge',
		phone: '+17015550188'
	},
	{
		key: 'grower3',
		name: 'Bertil Fennick',
		email: 'bertil@fennickacres.test',
		role: 'grower',
		org: 'brackenridge'
	},
	{
		key: 'regional',
		name: 'Sol Anand',
		email: 'sol@willowmere-extension.test',
		role: 'regional',
		org: 'extension'
	},
	{
		key: 'coopAgronomist',
		name: 'Rafe Lindqvist',
		email: 'rafe@ostrander.test',
		role: 'agronomist',
		org: 'ostrander'
	},
	{
		key: 'coopScout',
		name: 'Nell Whitcombe',
		email: 'nell@ostrander.test',
		role: 'scout',
		org: 'ostrander'
	},
	{
		key: 'coopGrower1',
		name: 'Odile Brask',
		email: 'odile@braskfarm.test',
		role: 'grower',
		org: 'ostrander'
	},
	{
		key: 'coopGrower2',
		name: 'Amos Kettering',
		email: 'amos@ketteringland.test',
		role: 'grower',
		org: 'ostrander'
	},
	{
		key: 'coopGrower3',
		name: 'Wren Halloway',
		email: 'wren@hallowayplace.test',
		role: 'grower',
		org: 'ostrander'
	}
];

export const DEMO_PEOPLE: DemoPerson[] = people.map((p) => ({
	...p,
	roleLabel: ROLE_LABELS[p.role]
}));

/** The sign-ins `npm start` prints: one per role of the main demo organisation, plus the viewer. */
export const DEMO_USERS = DEMO_PEOPLE.filter((p) =>
	['admin', 'agronomist', 'scout1', 'scout2', 'grower1', 'grower2', 'regional'].includes(p.key)
);
