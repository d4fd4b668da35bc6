import type { APIRoute } from 'astro';
import { logCsv } from '../render/log-csv.ts';
import { logEntries } from '../site/log-entries.ts';

export const GET: APIRoute = async () => new Response(logCsv((await logEntries()).map(({ page }) => page.result)), { headers: { 'Content-Type': 'text/csv' } });
