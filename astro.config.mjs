// @ts-check
import { defineConfig } from 'astro/config';
import groundwork from './src/site/integration.ts';
import { RECORDS_FOLDER } from './src/site/records-folder.ts';

// Record pages are rendered by groundwork's own unified pipeline (src/render/record-html.ts), which evaluates
// the spec blocks and sanitises the prose; Astro's collection lists the records and checks their front matter.
export default defineConfig({
  output: 'static',
  outDir: './dist',
  markdown: { syntaxHighlight: false },
  integrations: [groundwork({ records: RECORDS_FOLDER })],
});
