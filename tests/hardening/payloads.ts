import fc from 'fast-check';

/** Field names that the app's schemas use, so generated objects hit real validation paths. */
const FIELDS = [
	'clientKey',
	'blockId',
	'visitedOn',
	'startedAt',
	'position',
	'bbch',
	'airTempC',
	'sampleUnit',
	'mode',
	'tallyThreshold',
	'counts',
	'stop',
	'unit',
	'aphids',
	'alate',
	'infested',
	'enemies',
	'mummies',
	'notes',
	'photoIds',
	'trapId',
	'readOn',
	'daysOut',
	'alateCounts',
	'cardChanged',
	'decision',
	'productId',
	'targetDate',
	'rescoutBy',
	'id',
	'recommendationId',
	'appliedOn',
	'appliedBy',
	'type',
	'coordinates',
	'geometry',
	'features',
	'boundary',
	'name',
	'lat',
	'lon',
	'farmId',
	'scoutId',
	'intervalDays',
	'day',
	'tminC',
	'tmaxC',
	'kind',
	'csv',
	'file',
	'email',
	'password',
	'providerId',
	'channel',
	'minLevel',
	'activeIngredient',
	'iracGroup',
	'rate',
	'reiHours',
	'phiDays',
	'beeHazard',
	'action',
	'injury',
	'bbchFrom',
	'bbchTo',
	'metric',
	'source'
];

const HUGE = 'é'.repeat(60_000) + '\u202e';

/** Values of the wrong type, out of range, huge, or odd Unicode. */
export const weird: fc.Arbitrary<unknown> = fc.oneof(
	fc.string({ unit: 'grapheme', maxLength: 40 }),
	fc.string({ unit: 'binary', maxLength: 40 }),
	fc.constantFrom(
		'\u0000',
		'\uFFFF',
		'\uD800',
		'💥🐛',
		'NaN',
		'-0',
		'1e999',
		'<script>',
		"' OR 1=1 --",
		HUGE
	),
	fc.integer(),
	fc.double({ noNaN: true }),
	fc.constantFrom(-1, 0, 1.5, 1e308, -1e308, Number.MAX_SAFE_INTEGER + 2, 2 ** 31, -(2 ** 63)),
	fc.boolean(),
	fc.constant(null),
	fc.array(fc.oneof(fc.integer(), fc.string({ maxLength: 5 }), fc.constant(null)), {
		maxLength: 8
	}),
	fc.dictionary(fc.constantFrom(...FIELDS), fc.oneof(fc.integer(), fc.string({ maxLength: 5 })), {
		maxKeys: 4
	})
);

/** JSON bodies: arbitrary JSON, objects of known field names with weird values, bad GeoJSON. */
export const jsonBody: fc.Arbitrary<unknown> = fc.oneof(
	fc.jsonValue({ maxDepth: 3 }),
	fc.dictionary(fc.constantFrom(...FIELDS), weird, { maxKeys: 10 }),
	fc.record({
		type: fc.constantFrom('Polygon', 'Feature', 'FeatureCollection', 'Point', 'MultiPolygon', 'x'),
		coordinates: fc.oneof(
			fc.array(fc.array(fc.tuple(fc.double(), fc.double()), { maxLength: 6 }), { maxLength: 3 }),
			weird
		)
	}),
	fc.record(
		{
			blockId: fc.oneof(fc.integer({ min: -5, max: 100_000 }), weird),
			visitedOn: fc.oneof(fc.constantFrom('2026-13-45', '2026-02-30', '', 'today'), weird),
			mode: fc.oneof(fc.constantFrom('count', 'presence', 'maybe'), weird),
			sampleUnit: fc.oneof(fc.constantFrom('plant', 'leaf', ''), weird),
			counts: fc.oneof(
				fc.array(
					fc.record({
						stop: fc.oneof(fc.integer({ min: -3, max: 600 }), weird),
						unit: fc.oneof(fc.integer({ min: -3, max: 200 }), weird),
						aphids: fc.oneof(fc.constantFrom(-1, 1.5, 1e9), weird)
					}),
					{ maxLength: 5 }
				),
				weird
			)
		},
		{ requiredKeys: [] }
	)
);

/** Raw bodies that are not what any endpoint accepts. */
export const RAW_BODIES: { body: string; type: string }[] = [
	{ body: '{', type: 'application/json' },
	{ body: '[1,2', type: 'application/json' },
	{ body: '{"a":' + '['.repeat(5_000), type: 'application/json' },
	{ body: '\u0000\u0001\u0002', type: 'application/json' },
	{ body: '"just a string"', type: 'application/json' },
	{ body: 'null', type: 'application/json' },
	{ body: JSON.stringify({ notes: 'x'.repeat(2_000_000) }), type: 'application/json' },
	{ body: 'blockId=1&counts=2', type: 'application/x-www-form-urlencoded' },
	{ body: 'hello', type: 'text/plain' },
	{ body: '<xml/>', type: 'application/xml' },
	{
		body: '--b\r\nContent-Disposition: form-data; name="file"; filename="x.png"\r\nContent-Type: image/png\r\n\r\nnot a png\r\n--b--\r\n',
		type: 'multipart/form-data; boundary=b'
	},
	{ body: '--b\r\nbroken', type: 'multipart/form-data; boundary=b' },
	{ body: 'stop,unit,aphids\n1,1,-4\n"unclosed', type: 'text/csv' }
];

/** Form bodies: known field names with weird string values, as urlencoded pairs. */
export const formBody: fc.Arbitrary<Record<string, string>> = fc.dictionary(
	fc.constantFrom(...FIELDS),
	fc.oneof(
		fc.string({ unit: 'grapheme', maxLength: 30 }),
		fc.constantFrom('-1', '1.5', '1e308', '', '0', 'NaN', '2026-02-30', HUGE, '{"type":"Polygon"}'),
		fc.integer().map(String)
	),
	{ maxKeys: 8 }
);
