// Download: the model file exactly as it was verified.
import type { APIRoute } from 'astro';
import { loadSiteData, modelSource } from '../../../site/data.ts';

export function getStaticPaths() {
  const { records } = loadSiteData();
  return [...records.values()]
    .map((record) => ({ params: { id: record.id }, props: { source: modelSource(record) } }))
    .filter((path) => path.props.source !== null);
}

export const GET: APIRoute = ({ props }) => new Response(props.source as string, { headers: { 'content-type': 'application/json' } });
