import { z } from 'zod';
import { trapReadingSchema, visitCreateSchema } from '$lib/schemas/scouting';
import { PHOTO_MAX_BYTES } from './photos';

const schema = (s: z.ZodType) =>
	z.toJSONSchema(s, { io: 'input', target: 'openapi-3.0', unrepresentable: 'any' });

const problem = {
	type: 'object',
	properties: {
		message: { type: 'string' },
		issues: {
			type: 'array',
			items: {
				type: 'object',
				properties: { path: { type: 'string' }, message: { type: 'string' } }
			}
		}
	},
	required: ['message']
};

const refusals = {
	'400': {
		description: 'Invalid input; each issue names the field',
		content: { 'application/json': { schema: { $ref: '#/components/schemas/Problem' } } }
	},
	'401': { description: 'Not signed in' },
	'403': { description: 'Role not allowed, or a block the scout is not assigned to' },
	'404': { description: 'Unknown record, or one of another organisation' }
};

const idParam = (name: string) => ({
	name,
	in: 'path',
	required: true,
	schema: { type: 'integer', minimum: 1 }
});

/** The OpenAPI 3 document of the scouting endpoints, generated from the same zod schemas. */
export function openApiDocument(baseUrl: string) {
	return {
		openapi: '3.0.3',
		info: {
			title: 'Cornicle scouting API',
			version: '1',
			description:
				'Visits, trap readings and photos. Sign in first (the session cookie authenticates). A retried POST with the same clientKey stores once and answers 200 with the stored record.'
		},
		servers: [{ url: baseUrl }],
		components: {
			schemas: {
				VisitCreate: schema(visitCreateSchema),
				TrapReadingCreate: schema(trapReadingSchema),
				Problem: problem
			}
		},
		paths: {
			'/api/visits': {
				post: {
					summary:
						'File a visit with its unit counts; the block is reassessed in the same transaction',
					requestBody: {
						required: true,
						content: {
							'application/json': { schema: { $ref: '#/components/schemas/VisitCreate' } }
						}
					},
					responses: {
						'201': { description: 'Stored; body has visit and assessment (level, reason)' },
						'200': { description: 'Replay: a visit with this clientKey was already stored' },
						'409': { description: 'clientKey already used for another block or scout' },
						...refusals
					}
				}
			},
			'/api/visits/{id}': {
				get: {
					summary: 'One visit with counts and photos',
					parameters: [idParam('id')],
					responses: { '200': { description: 'The visit' }, ...refusals }
				}
			},
			'/api/blocks/{id}/visits': {
				get: {
					summary: "A block's visits, newest first",
					parameters: [
						idParam('id'),
						{ name: 'since', in: 'query', schema: { type: 'string', format: 'date' } },
						{
							name: 'limit',
							in: 'query',
							schema: { type: 'integer', minimum: 1, maximum: 500, default: 100 }
						}
					],
					responses: { '200': { description: 'The visits' }, ...refusals }
				}
			},
			'/api/blocks/{id}/visits.csv': {
				get: {
					summary: "A block's visits as CSV, one row per sample unit",
					parameters: [idParam('id')],
					responses: { '200': { description: 'text/csv' }, ...refusals }
				}
			},
			'/api/trap-readings': {
				post: {
					summary: 'Store a sticky-trap reading (idempotent by clientKey)',
					requestBody: {
						required: true,
						content: {
							'application/json': { schema: { $ref: '#/components/schemas/TrapReadingCreate' } }
						}
					},
					responses: {
						'201': { description: 'Stored' },
						'200': { description: 'Replay' },
						...refusals
					}
				}
			},
			'/api/photos': {
				post: {
					summary: `Upload a JPEG, PNG or WebP photo (at most ${PHOTO_MAX_BYTES / 1024 / 1024} MB; type read from the content)`,
					requestBody: {
						required: true,
						content: {
							'multipart/form-data': {
								schema: {
									type: 'object',
									properties: {
										file: { type: 'string', format: 'binary' },
										blockId: { type: 'integer' },
										trapId: { type: 'integer' },
										caption: { type: 'string', maxLength: 300 }
									},
									required: ['file']
								}
							}
						}
					},
					responses: {
						'201': { description: 'Stored; link it with photoIds on the visit' },
						'413': { description: 'Too large' },
						...refusals
					}
				}
			},
			'/api/photos/{id}': {
				get: {
					summary: 'The photo (or ?size=thumb), to users who may see its block',
					parameters: [
						idParam('id'),
						{ name: 'size', in: 'query', schema: { type: 'string', enum: ['thumb'] } }
					],
					responses: { '200': { description: 'image bytes' }, ...refusals }
				}
			}
		}
	};
}
