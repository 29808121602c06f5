// The JSON Schemas of model files and results records, published as they are in schemas/.
import type { APIRoute } from 'astro';
import { schemaFiles } from '../../site/schema-doc.ts';

export function getStaticPaths() {
  return schemaFiles().map((f) => ({ params: { path: f.path }, props: { text: f.text } }));
}

export const GET: APIRoute = ({ props }) => new Response(props.text as string, { headers: { 'content-type': 'application/schema+json' } });
