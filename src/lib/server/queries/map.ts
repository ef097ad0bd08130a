import type { LevelKey } from '$lib/engine';
import type { BBox } from '$lib/map/params';
import { readQuery } from '../db';

/** Whose blocks a map shows: the organisation's, or a grower's own, or a scout's assigned. */
export interface MapScope {
	organisationId: number;
	growerId?: number;
	scoutId?: number;
}

function scopeSql(scope: MapScope, alias: { farm: string; block?: string }) {
	const where: string[] = [];
	const args: unknown[] = [];
	if (scope.growerId != null) {
		where.push(`${alias.farm}.grower_id = ?`);
		args.push(scope.growerId);
	}
	if (scope.scoutId != null && alias.block) {
		where.push(
			`EXISTS (SELECT 1 FROM scouting_assignments sa WHERE sa.block_id = ${alias.block}.id AND sa.scout_id = ? AND sa.active = 1)`
		);
		args.push(scope.scoutId);
	}
	if (scope.scoutId != null && !alias.block) {
		where.push(
			`EXISTS (SELECT 1 FROM scouting_assignments sa JOIN blocks sb ON sb.id = sa.block_id WHERE sb.farm_id = ${alias.farm}.id AND sa.scout_id = ? AND sa.active = 1)`
		);
		args.push(scope.scoutId);
	}
	return { where, args };
}

// A JSON null stored by an ORM counts as no boundary, as SQL NULL does.
const DRAWN = `(b.boundary IS NOT NULL AND b.boundary <> 'null')`;

const levelAsOf = (col: 'level' | 'reason') =>
	`(SELECT a.${col} FROM assessments a WHERE a.block_id = b.id AND a.computed_at < DATE_ADD(?, INTERVAL 1 DAY) ORDER BY a.computed_at DESC, a.id DESC LIMIT 1)`;

type BlockQuery = { bbox?: BBox; crop?: string; pest?: string; on?: string; blockId?: number };

/** The WHERE of the block queries: the organisation, the scope and the filters. */
function blockWhere(scope: MapScope, q: BlockQuery) {
	const where = ['b.organisation_id = ?'];
	const args: unknown[] = [scope.organisationId];
	const s = scopeSql(scope, { farm: 'f', block: 'b' });
	where.push(...s.where);
	args.push(...s.args);
	if (q.bbox) {
		where.push('b.min_lat <= ? AND b.max_lat >= ? AND b.min_lon <= ? AND b.max_lon >= ?');
		args.push(q.bbox.maxLat, q.bbox.minLat, q.bbox.maxLon, q.bbox.minLon);
	}
	if (q.blockId != null) {
		where.push('b.id = ?');
		args.push(q.blockId);
	}
	if (q.crop) {
		where.push('c.code = ?');
		args.push(q.crop);
	}
	if (q.pest) {
		where.push('p.code = ?');
		args.push(q.pest);
	}
	return { sql: where.join(' AND '), args };
}

const BLOCK_JOINS = `FROM blocks b
		   JOIN farms f ON f.id = b.farm_id
		   JOIN crops c ON c.id = b.crop_id
		   JOIN pests p ON p.id = b.pest_id`;

// Everything the current-level list (not `detail`, not `on`) is made of, per block: the
// boundary by its checksum (area and centroid are computed from it when it is saved), the farm,
// crop and pest by id (their names and codes are summed up below, per organisation).
const PRINT_ROW = `CONCAT_WS('|', b.id, b.name, b.farm_id, b.crop_id, b.pest_id,
		IFNULL(b.current_level, '~'), IFNULL(b.last_visit_on, '~'), b.updated_at,
		IFNULL(CRC32(b.boundary), '~'))`;
/**
 * A fingerprint of what a current-level list shows: the number of blocks, a CRC-32 of every
 * shown field XORed over them, and the same over the organisation's farm names and the crop
 * and pest codes. A change to any of them, or a block entering or leaving the scope, changes it
 * (but for a 1 in 2^32 coincidence of checksums). Cheap: no JSON, no joins beyond the scope's.
 * Its one placeholder is the organisation's id.
 */
const PRINT = `CONCAT(COUNT(*), '.', COALESCE(BIT_XOR(CRC32(${PRINT_ROW})), 0), '.',
		(SELECT COALESCE(BIT_XOR(CRC32(CONCAT_WS('|', pf.id, pf.name, pf.grower_id))), 0)
		   FROM farms pf WHERE pf.organisation_id = ?), '.',
		(SELECT COALESCE(BIT_XOR(CRC32(CONCAT_WS('|', pc.id, pc.code))), 0) FROM crops pc), '.',
		(SELECT COALESCE(BIT_XOR(CRC32(CONCAT_WS('|', pp.id, pp.code))), 0) FROM pests pp))`;

/**
 * Blocks for the map as GeoJSON FeatureCollection text, built by MariaDB in one query: inside
 * `bbox` (overlapping it), filtered by crop and pest codes; with `on`, the level from the newest
 * assessment up to the end of that day. The list carries only what the map draws and filters
 * on (BlockFeatureProps); `detail` adds the level's reason and the crop and pest names.
 */
export async function mapBlocks(scope: MapScope, q: BlockQuery, detail = false): Promise<string> {
	return (await blocksWithPrint(scope, q, detail)).body;
}

/** As mapBlocks, with the fingerprint of the same rows read in the same statement. */
export async function blocksWithPrint(scope: MapScope, q: BlockQuery, detail = false) {
	const args: unknown[] = [];
	if (q.on) args.push(q.on);
	if (q.on && detail) args.push(q.on);
	const level = q.on ? levelAsOf('level') : 'b.current_level';
	const extra = detail
		? `, 'reason', ${q.on ? levelAsOf('reason') : 'b.current_reason'}, 'cropName', c.name, 'pestName', p.name`
		: '';
	const w = blockWhere(scope, q);
	args.push(scope.organisationId, ...w.args); // PRINT's placeholder, then the WHERE's
	// The stored boundary was checked when saved, so it is spliced in as it is.
	const [row] = await readQuery<{ fc: string | null; print: string }>(
		`SET STATEMENT group_concat_max_len = 1073741824 FOR
		 SELECT GROUP_CONCAT(CONCAT(
		          '{"type":"Feature","id":', b.id, ',"geometry":',
		          IF(${DRAWN}, b.boundary, JSON_OBJECT('type', 'Point', 'coordinates', JSON_ARRAY(b.centroid_lon, b.centroid_lat))),
		          ',"properties":', JSON_OBJECT('name', b.name, 'farm', f.name, 'crop', c.code, 'pest', p.code,
		            'areaHa', b.area_ha, 'level', ${level}, 'lastVisitOn', b.last_visit_on,
		            'drawn', ${DRAWN} ${extra}), '}')
		          ORDER BY b.id SEPARATOR ',') AS fc, ${PRINT} AS print
		   ${BLOCK_JOINS}
		  WHERE ${w.sql}`,
		args
	);
	return {
		body: `{"type":"FeatureCollection","features":[${row?.fc ?? ''}]}`,
		print: String(row?.print ?? '')
	};
}

/** The fingerprint alone (see PRINT): one light query, joining only what the scope needs. */
export async function mapPrint(scope: MapScope, q: BlockQuery): Promise<string> {
	const w = blockWhere(scope, q);
	const joins = [
		scope.growerId != null ? 'JOIN farms f ON f.id = b.farm_id' : '',
		q.crop ? 'JOIN crops c ON c.id = b.crop_id' : '',
		q.pest ? 'JOIN pests p ON p.id = b.pest_id' : ''
	].join(' ');
	const [row] = await readQuery<{ print: string }>(
		`SELECT ${PRINT} AS print FROM blocks b ${joins} WHERE ${w.sql}`,
		[scope.organisationId, ...w.args]
	);
	return String(row?.print ?? '');
}

export interface MapTrapRow {
	id: number;
	name: string;
	kind: string;
	farm: string;
	lat: number;
	lon: number;
	readOn: string | null;
	daysOut: number | null;
	alateTotal: number | null;
	alateCounts: string | Record<string, number> | null;
}

/** Active traps for the map with their newest reading between `from` and `to` (one query). */
export function mapTraps(scope: MapScope, q: { bbox?: BBox; from: string; to: string }) {
	const where = ['t.organisation_id = ?', 't.active = 1'];
	const args: unknown[] = [q.from, q.to, scope.organisationId];
	const s = scopeSql(scope, { farm: 'f' });
	where.push(...s.where);
	args.push(...s.args);
	if (q.bbox) {
		where.push('t.lat BETWEEN ? AND ? AND t.lon BETWEEN ? AND ?');
		args.push(q.bbox.minLat, q.bbox.maxLat, q.bbox.minLon, q.bbox.maxLon);
	}
	return readQuery<MapTrapRow>(
		`SELECT t.id, t.name, t.kind, f.name AS farm, t.lat, t.lon, r.read_on AS readOn,
		        r.days_out AS daysOut, r.alate_total AS alateTotal, r.alate_counts AS alateCounts
		   FROM traps t
		   JOIN farms f ON f.id = t.farm_id
		   LEFT JOIN trap_readings r ON r.id = (
		        SELECT r2.id FROM trap_readings r2
		         WHERE r2.trap_id = t.id AND r2.read_on BETWEEN ? AND ?
		         ORDER BY r2.read_on DESC, r2.id DESC LIMIT 1)
		  WHERE ${where.join(' AND ')}
		  ORDER BY t.id`,
		args
	);
}

/** Crops and pests present on the blocks in scope, for the map's filters (one query). */
export async function mapFilters(scope: MapScope) {
	const s = scopeSql(scope, { farm: 'f', block: 'b' });
	const rows = await readQuery<{ kind: 'crop' | 'pest'; code: string; name: string }>(
		`SELECT DISTINCT 'crop' AS kind, c.code, c.name FROM blocks b
		   JOIN farms f ON f.id = b.farm_id JOIN crops c ON c.id = b.crop_id
		  WHERE ${['b.organisation_id = ?', ...s.where].join(' AND ')}
		 UNION
		 SELECT DISTINCT 'pest', p.code, p.name FROM blocks b
		   JOIN farms f ON f.id = b.farm_id JOIN pests p ON p.id = b.pest_id
		  WHERE ${['b.organisation_id = ?', ...s.where].join(' AND ')}
		 ORDER BY 1, 3`,
		[scope.organisationId, ...s.args, scope.organisationId, ...s.args]
	);
	return {
		crops: rows.filter((r) => r.kind === 'crop').map(({ code, name }) => ({ code, name })),
		pests: rows.filter((r) => r.kind === 'pest').map(({ code, name }) => ({ code, name }))
	};
}

/** One row per farm, or per farm-week of levels or trap catches (see regionRows). */
export interface RegionRow {
	kind: 'farm' | 'level' | 'trap';
	week: string | null;
	farmId: number;
	lat: number;
	lon: number;
	level: LevelKey | null;
	blocks: number;
	alates: number | null;
	trapDays: number | null;
	traps: number;
}

/**
 * Everything the regional overview aggregates, in one query across every organisation of the
 * viewer's region: the farms (for the 3-farm floor), per farm and week the count of blocks at each
 * level as of the week's end (newest assessment), and per farm and week the trap catches.
 * Farm ids and positions stay on the server; the caller aggregates them into cells.
 */
export async function regionRows(
	viewerOrganisationId: number,
	weeks: { start: string; next: string }[]
) {
	const w = weeks.map(() => 'SELECT ? AS wk, ? AS nx').join(' UNION ALL ');
	const wArgs = weeks.flatMap((x) => [x.start, x.next]);
	const rows = await readQuery<RegionRow>(
		`WITH w AS (${w}),
		 rf AS (SELECT f.id, f.lat, f.lon FROM farms f
		          JOIN organisations o ON o.id = f.organisation_id
		         WHERE o.region = (SELECT v.region FROM organisations v WHERE v.id = ?)),
		 bl AS (SELECT w.wk, b.farm_id,
		               (SELECT a.level FROM assessments a WHERE a.block_id = b.id AND a.computed_at < w.nx
		                 ORDER BY a.computed_at DESC, a.id DESC LIMIT 1) AS level
		          FROM w JOIN blocks b JOIN rf ON rf.id = b.farm_id)
		 SELECT 'farm' AS kind, NULL AS week, rf.id AS farmId, rf.lat, rf.lon, NULL AS level,
		        0 AS blocks, NULL AS alates, NULL AS trapDays, 0 AS traps FROM rf
		 UNION ALL
		 SELECT 'level', bl.wk, rf.id, rf.lat, rf.lon, bl.level, COUNT(*), NULL, NULL, 0
		   FROM bl JOIN rf ON rf.id = bl.farm_id WHERE bl.level IS NOT NULL
		  GROUP BY bl.wk, rf.id, rf.lat, rf.lon, bl.level
		 UNION ALL
		 SELECT 'trap', w.wk, rf.id, rf.lat, rf.lon, NULL, 0, SUM(r.alate_total), SUM(r.days_out),
		        COUNT(DISTINCT t.id)
		   FROM w JOIN trap_readings r ON r.read_on >= w.wk AND r.read_on < w.nx
		   JOIN traps t ON t.id = r.trap_id JOIN rf ON rf.id = t.farm_id
		  GROUP BY w.wk, rf.id, rf.lat, rf.lon`,
		[...wArgs, viewerOrganisationId]
	);
	return rows.map((r) => ({
		...r,
		week: r.week ? String(r.week).slice(0, 10) : null,
		blocks: Number(r.blocks),
		alates: r.alates == null ? null : Number(r.alates),
		trapDays: r.trapDays == null ? null : Number(r.trapDays),
		traps: Number(r.traps)
	}));
}

/** The bounding box of the blocks in scope, to open the map on them (one query). */
export async function mapExtent(scope: MapScope): Promise<BBox | null> {
	const s = scopeSql(scope, { farm: 'f', block: 'b' });
	const [row] = await readQuery<{
		minLat: number | null;
		minLon: number;
		maxLat: number;
		maxLon: number;
	}>(
		`SELECT MIN(b.min_lat) AS minLat, MIN(b.min_lon) AS minLon, MAX(b.max_lat) AS maxLat, MAX(b.max_lon) AS maxLon
		   FROM blocks b JOIN farms f ON f.id = b.farm_id
		  WHERE ${['b.organisation_id = ?', ...s.where].join(' AND ')}`,
		[scope.organisationId, ...s.args]
	);
	return row?.minLat == null ? null : (row as BBox);
}
