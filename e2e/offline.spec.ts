/**
 * Issue 14, "Offline and on a lab's own server": the built site (dist/) served by a plain static file server
 * (a few lines of node:http below, not Vite) with the headers README.md lists, runs the review on the demo
 * participant; the evidence table exports as a real SVG figure (item 11); then the server is stopped, the
 * browser goes offline and the page reloads from the service worker's cache, demo included, still
 * cross-origin isolated. Needs a fresh `npx vite build` (dist/sw.js).
 */
import { expect, test } from '@playwright/test';
import { createServer, type Server } from 'node:http';
import { readFile, stat } from 'node:fs/promises';
import { extname, join, normalize, sep } from 'node:path';
import { fileURLToPath } from 'node:url';
import { securityHeaders } from '../vite.config.ts';

const dist = fileURLToPath(new URL('../dist/', import.meta.url));
const LOAD_TIMEOUT = 75_000;

const TYPES: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.json': 'application/json',
  '.wasm': 'application/wasm',
  '.map': 'application/json',
};

/** A plain static server of dist/ on a free port: files as they are, index.html for "/", the three headers. */
async function serveDist(): Promise<{ url: string; requests: string[]; close: () => Promise<void> }> {
  const requests: string[] = [];
  const server: Server = createServer(async (req, res) => {
    const path = decodeURIComponent(new URL(req.url ?? '/', 'http://x').pathname);
    requests.push(path);
    const file = normalize(join(dist, path.endsWith('/') ? `${path}index.html` : path));
    if (!file.startsWith(dist.endsWith(sep) ? dist : dist + sep)) return void res.writeHead(403).end();
    try {
      if (!(await stat(file)).isFile()) throw new Error('not a file');
      const body = await readFile(file);
      res.writeHead(200, { ...securityHeaders, 'Content-Type': TYPES[extname(file)] ?? 'application/octet-stream', 'Content-Length': body.length });
      res.end(body);
    } catch {
      res.writeHead(404, securityHeaders).end('not found');
    }
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : 0;
  return {
    url: `http://127.0.0.1:${port}`,
    requests,
    close: () => new Promise<void>((resolve) => { server.closeAllConnections(); server.close(() => resolve()); }),
  };
}

test('served from a plain static server, the review runs, then works offline after a reload', async ({ browser }) => {
  test.setTimeout(180_000);
  await stat(join(dist, 'sw.js')).catch(() => {
    throw new Error('dist/sw.js missing: run `npx vite build` first');
  });
  const server = await serveDist();
  const context = await browser.newContext({ acceptDownloads: true });
  try {
    const page = await context.newPage();
    await page.goto(`${server.url}/?demo=1`);
    await expect(page.getByTestId('board')).toBeVisible({ timeout: LOAD_TIMEOUT });
    expect(await page.evaluate(() => crossOriginIsolated)).toBe(true); // COOP + COEP from the static server

    // the review: decide component 1
    await page.getByTestId('tile-1').click();
    await page.getByTestId('verdict-remove').click();
    await page.getByTestId('reason-select').selectOption('blink');
    await expect(page.getByTestId('tile-1')).toHaveAttribute('data-verdict', 'remove');

    // item 11: the evidence table exported as SVG is a figure with one text row per table row
    await page.getByTestId('tile-1').focus();
    await page.keyboard.press('Enter');
    await expect(page.getByTestId('focus-view')).toBeVisible();
    const evidence = page.locator('section[aria-label="Evidence"]');
    await expect(evidence.locator('table tbody tr').first()).toBeVisible({ timeout: 30_000 });
    const rowCount = await evidence.locator('table tbody tr').count();
    const firstLabel = (await evidence.locator('table tbody tr th').first().innerText()).trim();
    const [download] = await Promise.all([page.waitForEvent('download'), evidence.getByRole('button', { name: 'SVG', exact: true }).click()]);
    const svg = await readFile(await download.path(), 'utf8');
    const height = Number(/<svg[^>]* height="([\d.]+)"/.exec(svg)?.[1]);
    expect(height).toBeGreaterThan(15 * (rowCount + 1)); // not the 1 × 19 px title strip of before
    expect(svg).toContain(`>${firstLabel.replace(/&/g, '&amp;').replace(/</g, '&lt;')}</text>`);
    expect((svg.match(/<text /g) ?? []).length).toBeGreaterThan(rowCount * 3);
    await page.keyboard.press('Escape');

    // the service worker has stored the whole build, the demo recording included
    const cached = await page.evaluate(async () => {
      await navigator.serviceWorker.ready;
      const name = (await caches.keys()).find((k) => k.startsWith('winnow-offline-'));
      if (!name) return [];
      return (await (await caches.open(name)).keys()).map((r) => new URL(r.url).pathname);
    });
    expect(cached).toContain('/index.html');
    expect(cached.some((p) => p.endsWith('.edf'))).toBe(true);
    expect(cached.some((p) => /\.worker-[\w-]+\.js$/.test(p))).toBe(true);

    // offline: no server and no network; the reload comes from the cache
    await server.close();
    await context.setOffline(true);
    const requestsBefore = server.requests.length;
    await page.reload();
    await expect(page.getByTestId('board')).toBeVisible({ timeout: LOAD_TIMEOUT });
    expect(await page.evaluate(() => crossOriginIsolated)).toBe(true); // cached responses keep their headers
    expect(server.requests.length).toBe(requestsBefore);
    const resume = page.getByTestId('resume-accept');
    if (await resume.isVisible().catch(() => false)) await resume.click();
    await expect(page.getByTestId('tile-1')).toHaveAttribute('data-verdict', 'remove'); // the saved review is there offline too

    // a fresh tab offline opens the start page from the cache
    const page2 = await context.newPage();
    await page2.goto(`${server.url}/`);
    await expect(page2.locator('#root')).not.toBeEmpty({ timeout: 30_000 });
    await page2.close();
  } finally {
    await context.close();
    await server.close().catch(() => undefined);
  }
});
