// The inventory rows with their invariant profiles, for the search script.
import type { APIRoute } from 'astro';
import { inventoryRow } from '../../site/inventory.ts';
import { publishedModels } from '../../site/pages.ts';

export const GET: APIRoute = () => new Response(JSON.stringify(publishedModels().map(inventoryRow)), { headers: { 'content-type': 'application/json' } });
