// Download: the results record of one published model, as written by the catalogue.
import type { APIRoute } from 'astro';
import { publishedModels } from '../../../site/pages.ts';

export function getStaticPaths() {
  return publishedModels().map((record) => ({ params: { id: record.id }, props: { record } }));
}

export const GET: APIRoute = ({ props }) => new Response(JSON.stringify(props.record, null, 2), { headers: { 'content-type': 'application/json' } });
