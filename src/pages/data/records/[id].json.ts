// Download: the results record of one model, as written by the catalogue.
import type { APIRoute } from 'astro';
import { loadSiteData } from '../../../site/data.ts';

export function getStaticPaths() {
  const { records } = loadSiteData();
  return [...records.values()].map((record) => ({ params: { id: record.id }, props: { record } }));
}

export const GET: APIRoute = ({ props }) => new Response(JSON.stringify(props.record, null, 2), { headers: { 'content-type': 'application/json' } });
