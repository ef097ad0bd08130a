// Who may open each page and endpoint. The route-walk test reads the route tree and fails for
// any route missing here, so a new route cannot forget its guard. Paths with {placeholders}
// are filled from the demo scenario (see helpers/fixtures.ts) with records the role may see.
import type { Role } from '../src/lib/roles';

export const ALL_ROLES: Role[] = ['admin', 'agronomist', 'scout', 'grower', 'regional'];
/** Everyone who can be sent alerts (My alerts); the regional view is not. */
const ALERTED: Role[] = ['admin', 'agronomist', 'scout', 'grower'];

export interface AccessRule {
	/** The URL to probe; defaults to the route id without groups. */
	path?: string;
	/** Roles that get in; everyone else must be refused (403, or 404 for records they cannot see). */
	roles: Role[];
}

/** Pages under src/routes/(app), by route id. */
export const PAGES: Record<string, AccessRule> = {
	'/(app)/desk': { roles: ['agronomist', 'admin'] },
	'/(app)/rounds': { roles: ['scout'] },
	'/(app)/rounds/[id]/visit': {
		path: '/rounds/{block}/visit',
		roles: ['scout', 'agronomist', 'admin']
	},
	'/(app)/rounds/outbox': { roles: ['scout', 'agronomist', 'admin'] },
	'/(app)/assignments': { roles: ['agronomist', 'admin'] },
	'/(app)/traps': { roles: ['agronomist', 'admin', 'scout'] },
	'/(app)/weather': { roles: ['agronomist', 'admin', 'scout'] },
	'/(app)/import': { roles: ['agronomist', 'admin'] },
	'/(app)/rounds/traps/[id]': {
		path: '/rounds/traps/{trap}',
		roles: ['scout', 'agronomist', 'admin']
	},
	'/(app)/my-farms': { roles: ['grower'] },
	'/(app)/region': { roles: ['regional'] },
	'/(app)/map': { roles: ['admin', 'agronomist', 'scout', 'grower'] },
	'/(app)/blocks/[id]/boundary': {
		path: '/blocks/{block}/boundary',
		roles: ['agronomist', 'admin']
	},
	'/(app)/admin/people': { roles: ['admin'] },
	'/(app)/settings': { roles: ALERTED },
	'/(app)/blocks/[id]': { path: '/blocks/{block}', roles: ['agronomist', 'admin', 'grower'] },
	'/(app)/blocks/[id]/recommend': {
		path: '/blocks/{block}/recommend',
		roles: ['agronomist', 'admin']
	},
	'/(app)/blocks/[id]/report': {
		path: '/blocks/{block}/report',
		roles: ['agronomist', 'admin', 'grower']
	},
	'/(app)/recommendations': { roles: ['agronomist', 'admin'] },
	'/(app)/library/products': { roles: ['agronomist', 'admin'] },
	'/(app)/library/thresholds': { roles: ['agronomist', 'admin'] },
	'/(app)/audit': { roles: ['agronomist', 'admin'] },
	'/(app)/alerts': { roles: ['agronomist', 'admin'] }
};

/** Endpoints under src/routes/api that need a signed-in user, by "METHOD route id". */
export const ENDPOINTS: Record<string, AccessRule> = {
	'GET /api/me': { roles: ALL_ROLES },
	'POST /api/visits': { roles: ['scout', 'agronomist', 'admin'] },
	'GET /api/visits/[id]': {
		path: '/api/visits/{visit}',
		roles: ['scout', 'agronomist', 'admin', 'grower']
	},
	'GET /api/blocks/[id]/visits': {
		path: '/api/blocks/{block}/visits',
		roles: ['scout', 'agronomist', 'admin', 'grower']
	},
	'GET /api/blocks/[id]/visits.csv': {
		path: '/api/blocks/{block}/visits.csv',
		roles: ['scout', 'agronomist', 'admin', 'grower']
	},
	'POST /api/trap-readings': { roles: ['scout', 'agronomist', 'admin'] },
	'POST /api/photos': { roles: ['scout', 'agronomist', 'admin'] },
	'GET /api/photos/[id]': {
		path: '/api/photos/{photo}',
		roles: ['scout', 'agronomist', 'admin', 'grower']
	},
	'GET /api/map/blocks': { roles: ['admin', 'agronomist', 'scout', 'grower'] },
	'GET /api/map/traps': { roles: ['admin', 'agronomist', 'scout', 'grower'] },
	'GET /api/region/cells': { roles: ['regional'] },
	'GET /api/blocks/[id]/boundary': {
		path: '/api/blocks/{block}/boundary',
		roles: ['admin', 'agronomist', 'scout', 'grower']
	},
	'PUT /api/blocks/[id]/boundary': {
		path: '/api/blocks/{block}/boundary',
		roles: ['admin', 'agronomist']
	},
	'GET /api/recommendations': { roles: ['agronomist', 'admin', 'grower'] },
	'POST /api/recommendations': { roles: ['agronomist', 'admin'] },
	'POST /api/recommendations/check': { roles: ['agronomist', 'admin'] },
	// Refused before the record is looked up, so any id probes the role check.
	'POST /api/recommendations/[id]/acknowledge': {
		path: '/api/recommendations/0/acknowledge',
		roles: ['grower']
	},
	'GET /api/triage.csv': { roles: ['agronomist', 'admin'] }
};

/** Routes anyone may reach, signed in or not (each listed with why). */
export const PUBLIC: Record<string, string> = {
	'/': 'landing page',
	'/signin': 'sign-in',
	'/signin/check-email': 'sign-in link sent',
	'/signout': 'sign-out action',
	'GET /api/health': 'load balancer health check',
	'GET /api/openapi.json': 'the API description; it holds no data',
	'POST /api/webhooks/sms/status':
		'SMS provider status callbacks; refused (403) unless X-Twilio-Signature matches',
	'POST /api/webhooks/sms/inbound':
		'SMS provider inbound texts (STOP/START/HELP, acknowledgements); refused (403) unless signed'
};

const ADVISERS: Role[] = ['agronomist', 'admin'];

/** Form actions by "route id ?/name"; the access matrix fails for any action missing here. */
export const ACTIONS: Record<string, AccessRule> = {
	'/(app)/assignments ?/assign': { roles: ADVISERS },
	'/(app)/assignments ?/end': { roles: ADVISERS },
	'/(app)/blocks/[id] ?/issue': { path: '/blocks/{block}', roles: ADVISERS },
	'/(app)/blocks/[id] ?/withdraw': { path: '/blocks/{block}', roles: ADVISERS },
	'/(app)/blocks/[id] ?/acknowledge': { path: '/blocks/{block}', roles: ['grower'] },
	'/(app)/blocks/[id] ?/applied': { path: '/blocks/{block}', roles: [...ADVISERS, 'grower'] },
	'/(app)/blocks/[id]/boundary ?/default': { path: '/blocks/{block}/boundary', roles: ADVISERS },
	'/(app)/blocks/[id]/recommend ?/draft': { path: '/blocks/{block}/recommend', roles: ADVISERS },
	'/(app)/blocks/[id]/recommend ?/issue': { path: '/blocks/{block}/recommend', roles: ADVISERS },
	'/(app)/import ?/preview': { roles: ADVISERS },
	'/(app)/import ?/commit': { roles: ADVISERS },
	'/(app)/library/products ?/save': { roles: ADVISERS },
	'/(app)/library/products ?/retire': { roles: ADVISERS },
	'/(app)/library/products ?/restore': { roles: ADVISERS },
	'/(app)/library/thresholds ?/save': { roles: ADVISERS },
	'/(app)/library/thresholds ?/retire': { roles: ADVISERS },
	'/(app)/library/thresholds ?/restore': { roles: ADVISERS },
	'/(app)/my-farms ?/acknowledge': { roles: ['grower'] },
	'/(app)/my-farms ?/applied': { roles: ['grower'] },
	'/(app)/recommendations ?/issue': { roles: ADVISERS },
	'/(app)/recommendations ?/withdraw': { roles: ADVISERS },
	'/(app)/recommendations ?/applied': { roles: ADVISERS },
	'/(app)/traps ?/add': { roles: ADVISERS },
	'/(app)/weather ?/day': { roles: ['agronomist', 'admin', 'scout'] },
	'/(app)/weather ?/csv': { roles: ['agronomist', 'admin', 'scout'] },
	'/(app)/settings ?/contact': { roles: ALERTED },
	'/(app)/settings ?/save': { roles: ALERTED },
	'/(app)/settings ?/pause': { roles: ALERTED },
	'/(app)/settings ?/resume': { roles: ALERTED },
	'/(app)/settings ?/remove': { roles: ALERTED }
};

/** Actions anyone may post (sign-in and sign-out). */
export const PUBLIC_ACTIONS = ['/signin ?/password', '/signin ?/link', '/signout ?/default'];
