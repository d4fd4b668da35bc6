import type { APIRoute } from 'astro';
import { logEntries } from '../../site/log-entries.ts';

export async function getStaticPaths() {
  return (await logEntries()).map(({ id, page }) => ({ params: { slug: id }, props: { result: page.result } }));
}

/** The record's result as `groundwork check --json` gives it, next to its page. */
export const GET: APIRoute = ({ props }) => new Response(JSON.stringify(props.result, null, 2), { headers: { 'Content-Type': 'application/json' } });
