import type { MapScope } from './queries/map';

/** Whose blocks a user's map shows: a grower's own farms, a scout's assignments, else the organisation's. */
export function mapScopeOf(user: SessionUser): MapScope {
	if (user.role === 'grower') return { organisationId: user.organisationId, growerId: user.id };
	if (user.role === 'scout') return { organisationId: user.organisationId, scoutId: user.id };
	return { organisationId: user.organisationId };
}
