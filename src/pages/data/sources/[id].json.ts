// Download: the model file exactly as it was verified.
import type { APIRoute } from 'astro';
import { publishedModels } from '../../../site/pages.ts';
import { sourceText } from '../../../site/model-source.ts';

export function getStaticPaths() {
  return publishedModels()
    .map((record) => ({ params: { id: record.id }, props: { source: sourceText(record) } }))
    .filter((path) => path.props.source !== null);
}

export const GET: APIRoute = ({ props }) => new Response(props.source as string, { headers: { 'content-type': 'application/json' } });
