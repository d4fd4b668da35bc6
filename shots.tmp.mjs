// Screenshots of the built site (not part of the project): index and every record at 1300 and 390 px, and a printed record.
import { createServer } from 'node:http';
import { readFile, readdir } from 'node:fs/promises';
import { extname, join } from 'node:path';
import { chromium } from 'playwright-core';
const DIST = new URL('./dist', import.meta.url).pathname;
const TYPES = { '.html': 'text/html', '.css': 'text/css', '.js': 'text/javascript', '.woff2': 'font/woff2', '.svg': 'image/svg+xml', '.json': 'application/json' };
const server = createServer(async (req, res) => {
  let path = decodeURIComponent(new URL(req.url, 'http://x').pathname);
  if (path.endsWith('/')) path += 'index.html';
  try { const body = await readFile(join(DIST, path)); res.writeHead(200, { 'content-type': TYPES[extname(path)] ?? 'application/octet-stream' }); res.end(body); } catch { res.writeHead(404); res.end(); }
});
await new Promise((r) => server.listen(0, '127.0.0.1', r));
const base = `http://127.0.0.1:${server.address().port}`;
const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--no-first-run'] });
const records = (await readdir(join(DIST, 'records'), { withFileTypes: true })).filter((d) => d.isDirectory()).map((d) => d.name);
const only = process.argv[2];
const pages = [['index', '/'], ...records.map((r) => [r, `/records/${r}/`])].filter(([n]) => !only || n.includes(only));
for (const width of [1300, 390]) {
  const page = await browser.newPage({ viewport: { width, height: 900 } });
  for (const [name, path] of pages) {
    await page.goto(base + path);
    await page.screenshot({ path: `/tmp/pt-shots/${name}-${width}.png`, fullPage: true });
  }
  await page.close();
}
const page = await browser.newPage();
await page.goto(`${base}/records/2026-11-bond-m3-morse/`);
await page.emulateMedia({ media: 'print' });
await page.pdf({ path: '/tmp/pt-shots/print.pdf', format: 'A4', printBackground: false });
await browser.close();
server.close();
console.log('shots', pages.length);
