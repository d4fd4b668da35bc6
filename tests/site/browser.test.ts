import { execFileSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { readFile } from 'node:fs/promises';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { extname, join } from 'node:path';
import { chromium, type Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

const ROOT = new URL('../..', import.meta.url).pathname;
const DIST = join(ROOT, 'dist');
const CHROMIUM = '/usr/bin/chromium';
// CI installs Debian's chromium and must run this test; elsewhere it is skipped only when the browser is absent.
const run = process.env.CI === 'true' || existsSync(CHROMIUM);
const TYPES: Record<string, string> = { '.html': 'text/html', '.css': 'text/css', '.js': 'text/javascript', '.woff2': 'font/woff2', '.svg': 'image/svg+xml', '.json': 'application/json' };

describe.runIf(run)('the demo log in a real browser', () => {
  let server: Server;
  let browser: Browser;
  let base: string;

  beforeAll(async () => {
    execFileSync('npx', ['astro', 'build'], { cwd: ROOT, stdio: 'pipe' });
    server = createServer(async (req, res) => {
      let path = decodeURIComponent(new URL(req.url ?? '/', 'http://localhost').pathname);
      if (path.endsWith('/')) path += 'index.html';
      try {
        const body = await readFile(join(DIST, path));
        res.writeHead(200, { 'content-type': TYPES[extname(path)] ?? 'application/octet-stream' });
        res.end(body);
      } catch {
        res.writeHead(404);
        res.end();
      }
    });
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
    base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
    browser = await chromium.launch({
      executablePath: CHROMIUM,
      args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--no-first-run'],
    });
  }, 180_000);

  afterAll(async () => {
    await browser?.close();
    server?.close();
  });

  it('opens the index, follows a record, and finds typeset math, statuses and no console errors', async () => {
    const page = await browser.newPage();
    const errors: string[] = [];
    page.on('console', (m) => m.type() === 'error' && errors.push(m.text()));
    page.on('pageerror', (e) => errors.push(e.message));
    await page.goto(base + '/');
    // Every demo block appears in the index with its status (the demo log has six blocks).
    expect(await page.locator('.gw-block-list li').count()).toBe(6);
    await page.getByRole('link', { name: /Donor D-7/ }).click();
    await page.waitForURL(/records\/2026-11-donor-d7-radial/);
    expect(await page.locator('.gw-panel').count()).toBe(2);
    expect(await page.locator('.gw-panel[data-status="confirmed"]').count()).toBe(2);
    // KaTeX typesets both the prose math and the panel inputs.
    expect(await page.locator('.katex').count()).toBeGreaterThan(10);
    // The exact 1s level -1/2 hartree (any quantum mechanics textbook) is printed in the results table.
    expect(await page.locator('#block-d7-slater .gw-results').innerText()).toContain('-0.5');
    expect(errors).toEqual([]);
  }, 60_000);
});
