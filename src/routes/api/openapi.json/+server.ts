import { json } from '@sveltejs/kit';
import { openApiDocument } from '$lib/server/scouting/openapi';
import type { RequestHandler } from './$types';

// Public on purpose (see public-paths.ts): the document describes the API, it holds no data.
export const GET: RequestHandler = ({ url }) => json(openApiDocument(url.origin));
