import type { APIRoute } from 'astro';
import { withVerdicts } from '../../log/block-verdict.ts';
import { logEntries } from '../../site/log-entries.ts';

export async function getStaticPaths() {
  return (await logEntries()).map(({ id, page }) => ({ params: { slug: id }, props: { result: page.result } }));
}

/** The record's result as `groundwork check --json` gives it, next to its page. */
export const GET: APIRoute = ({ props }) => new Response(JSON.stringify(withVerdicts({ tool: { name: 'groundwork', version: '' }, records: [props.result] }, { plots: true }).records[0], null, 2), { headers: { 'Content-Type': 'application/json' } });
