/**
 * Issue 14, "Offline and on a lab's own server": the built site (dist/) served by a plain static file server
 * (a few lines of node:http below, not Vite) with the headers README.md lists, runs the review on the demo
 * participant; the evidence table exports as a real SVG figure (item 11); then the server is stopped, the
 * browser goes offline and the page reloads from the service worker's cache, demo included, still
 * cross-origin isolated. The cleaned recording the browser exports is re-read by EDFlib (libedf-dev, through
 * test/cross-reader/edflib-harness.c) and compared with Winnow's reading, digital value by digital value.
 * Needs a fresh `npx vite build` (dist/sw.js).
 */
import { expect, test } from '@playwright/test';
import { createServer, type Server } from 'node:http';
import { cp, mkdtemp, readFile, rm, stat } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { extname, join, normalize, sep } from 'node:path';
import { fileURLToPath } from 'node:url';
import { securityHeaders } from '../vite.config.ts';
import { bytesByteSource } from '../src/core/formats/byte-source.ts';
import { iterateEdfSignals, readEdfInfo } from '../src/core/formats/edf.ts';
import { compileHarness, libRead } from '../test/cross-reader/edflib-harness.ts';

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

/**
 * A plain static server of a copy of dist/ on a free port: files as they are, index.html for "/", the three
 * headers. The copy keeps the test on one build while others rebuild the shared dist/.
 */
async function serveDist(): Promise<{ url: string; requests: string[]; close: () => Promise<void> }> {
  const requests: string[] = [];
  const root = await mkdtemp(join(tmpdir(), 'winnow-dist-'));
  await cp(dist, root, { recursive: true });
  const server: Server = createServer(async (req, res) => {
    const path = decodeURIComponent(new URL(req.url ?? '/', 'http://x').pathname);
    requests.push(path);
    const file = normalize(join(root, path.endsWith('/') ? `${path}index.html` : path));
    if (!file.startsWith(root + sep)) return void res.writeHead(403).end();
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
    close: async () => {
      await new Promise<void>((resolve) => { server.closeAllConnections(); server.close(() => resolve()); });
      await rm(root, { recursive: true, force: true });
    },
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

    // the browser's cleaned-recording export, re-read by an independent EDF library (cross-reader, issue 14)
    await page.getByTestId('export-open').click();
    const [edfDownload] = await Promise.all([page.waitForEvent('download', { timeout: 60_000 }), page.getByTestId('export-cleaned').click()]);
    // saved at once into a folder of this test's own (test-results/ is shared with other runs)
    const tmp = await mkdtemp(join(tmpdir(), 'winnow-offline-'));
    const edfPath = join(tmp, 'cleaned.edf');
    await edfDownload.saveAs(edfPath);
    await page.keyboard.press('Escape');
    try {
      const harness = compileHarness(tmp);
      if (!harness.exe) console.warn(`EDFlib cross-read of the browser export skipped: ${harness.reason}`);
      else {
        const lib = libRead(harness.exe, edfPath);
        const bytes = new Uint8Array(await readFile(edfPath));
        const info = await readEdfInfo(bytesByteSource(bytes, 'export.edf'));
        expect(info.ok).toBe(true);
        if (!info.ok) return;
        expect(lib.filetype).toBe(1); // EDF+
        expect(lib.signals.map((s) => s.label.trim())).toEqual(info.value.channels.map((c) => c.label));
        expect(lib.datarecordsInFile).toBe(info.value.header.records);
        expect(lib.annotations.map((a) => a.text)).toEqual(info.value.events.filter((e) => e.source === 'annotation').map((e) => e.label));
        let mismatches = 0;
        for (const [j, s] of lib.signals.entries()) {
          const c = info.value.channels[j];
          expect([s.physMin, s.physMax, s.digMin, s.digMax, s.smpInDatarecord]).toEqual([c.physicalMin, c.physicalMax, c.digitalMin, c.digitalMax, c.samplesPerRecord]);
          const step = (s.physMax - s.physMin) / (s.digMax - s.digMin);
          let k = 0;
          for await (const chunk of iterateEdfSignals(bytesByteSource(bytes, 'export.edf'), info.value, { channels: [c.label] })) {
            if (!chunk.ok) throw new Error(chunk.error.message);
            for (const v of chunk.value.data) if (Math.round((v - s.physMin) / step + s.digMin) !== s.digital[k++]) mismatches++;
          }
          expect(k).toBe(s.smpInFile);
        }
        expect(mismatches).toBe(0);
      }
    } finally {
      await rm(tmp, { recursive: true, force: true });
    }

    // item 11: an evidence table exports as a figure with one text row per table row. The focus view shows
    // the evidence tables beside each answer's figures; a copy of the one shown is put into the first
    // exportable panel, whose SVG export then has to draw it (the export used to copy only svg/canvas).
    await page.getByTestId('tile-1').focus();
    await page.keyboard.press('Enter');
    await expect(page.getByTestId('focus-view')).toBeVisible();
    const table = page.locator('table.evidence-table:visible').first();
    await expect(table.locator('tbody tr').first()).toBeVisible({ timeout: 30_000 });
    const rowCount = await table.locator('tbody tr').count();
    const firstValue = (await table.locator('tbody tr td').first().innerText()).replace(/\s+/g, ' ').trim();
    const panel = page.locator('section.panel').filter({ has: page.locator('.panel-export') }).first();
    await panel.locator('.panel-body').evaluate((body) => {
      const t = Array.from(document.querySelectorAll<HTMLTableElement>('table.evidence-table')).find((el) => el.offsetParent !== null);
      if (t) body.appendChild(t.cloneNode(true));
    });
    const [download] = await Promise.all([page.waitForEvent('download'), panel.getByRole('button', { name: 'SVG', exact: true }).click()]);
    const svgPath = join(tmpdir(), `winnow-offline-${process.pid}-evidence.svg`);
    await download.saveAs(svgPath);
    const svg = await readFile(svgPath, 'utf8');
    await rm(svgPath, { force: true });
    const texts = [...svg.matchAll(/<text[^>]*>([^<]*)<\/text>/g)].map((m) => m[1]);
    expect(texts.length).toBeGreaterThan(rowCount * 2);
    expect(texts.join(' ')).toContain(firstValue.split(' ')[0].replace(/&/g, '&amp;').replace(/</g, '&lt;'));
    const height = Number(/<svg[^>]* height="([\d.]+)"/.exec(svg)?.[1]);
    expect(height).toBeGreaterThan(15 * (rowCount + 1)); // not the 1 × 19 px title strip of before
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
