// The full-text search index (MiniSearch) over every published model.
import type { APIRoute } from 'astro';
import { searchPayload } from '../../site/search/search-data.ts';
import { publishedModels } from '../../site/pages.ts';

export const GET: APIRoute = () => new Response(searchPayload(publishedModels()).index, { headers: { 'content-type': 'application/json' } });
