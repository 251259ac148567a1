/**
 * Issue 7: the whole review on the simulated demo participant — board, decide with reason and note,
 * live preview, focus, export, autosave across a reload, keyboard-only review, import into a fresh session,
 * and no request leaving the page's origin. Screenshots go to test-results/.
 */
import { expect, test, type Page } from '@playwright/test';
import { readFile } from 'node:fs/promises';

const ORIGIN = process.env.WINNOW_E2E_ORIGIN ?? 'http://127.0.0.1:4173';
/** Demo load = read + decomposition + evidence in the browser. */
const LOAD_TIMEOUT = 75_000;

function watchOrigin(page: Page, offOrigin: string[]) {
  page.on('request', (r) => {
    const url = new URL(r.url());
    if ((url.protocol === 'http:' || url.protocol === 'https:' || url.protocol === 'ws:' || url.protocol === 'wss:') && url.origin !== ORIGIN) offOrigin.push(r.url());
  });
}

async function openDemo(page: Page): Promise<number> {
  await page.goto('/?demo=1');
  await expect(page.getByTestId('board')).toBeVisible({ timeout: LOAD_TIMEOUT });
  const counter = await page.getByTestId('board-counter').innerText();
  const m = /(\d+) \/ (\d+)/.exec(counter);
  expect(m).not.toBeNull();
  return Number(m![2]);
}

const verdictOf = (page: Page, i: number) => page.getByTestId(`tile-${i}`).getAttribute('data-verdict');

test.describe.configure({ mode: 'serial' });

test('reviewing the demo participant: decide, preview, focus, export, reload, keyboard, import', async ({ page, browser }) => {
  test.setTimeout(170_000);
  const offOrigin: string[] = [];
  watchOrigin(page, offOrigin);

  // The board shows every component.
  const n = await openDemo(page);
  expect(n).toBeGreaterThan(3);
  await expect(page.locator('[data-testid^="tile-"]')).toHaveCount(n);
  await page.screenshot({ path: 'test-results/board.png', fullPage: true });

  // Preview before any removal.
  await page.getByTestId('screen-preview').click();
  const checksum = page.getByTestId('preview-cleaned-checksum');
  await expect(checksum).toHaveText(/^[0-9a-f]{8}$/, { timeout: 30_000 });
  const checksumBefore = (await checksum.textContent()) ?? '';
  const erpBefore = await page.getByTestId('preview-erp-before').innerText();
  await expect(page.getByTestId('preview-erp-after')).toHaveText(erpBefore);

  // Mark component 1 remove with a reason and a note, on the board.
  await page.getByTestId('screen-board').click();
  await page.getByTestId('tile-1').click();
  await page.getByTestId('verdict-remove').click();
  await page.getByTestId('reason-select').selectOption('blink');
  await page.getByTestId('note-field').fill('frontal, blink-shaped <b>not html</b>');
  await page.getByTestId('note-field').blur();
  await expect(page.getByTestId('tile-1')).toHaveAttribute('data-verdict', 'remove');
  await expect(page.getByTestId('tile-1')).toContainText('<b>not html</b>');

  // The preview follows: cleaned traces change and the ERP before/after differs.
  await page.getByTestId('screen-preview').click();
  await expect(page.getByTestId('preview-removed-count')).toHaveText('1');
  await expect(checksum).not.toHaveText(checksumBefore);
  await expect(page.getByTestId('preview-erp-after')).not.toHaveText(erpBefore);
  await page.screenshot({ path: 'test-results/preview.png', fullPage: true });

  // Focus view of the selected component: the four questions, walked with the keyboard (↓ moves between them).
  await page.getByTestId('screen-board').click();
  await page.getByTestId('tile-1').focus();
  await page.keyboard.press('Enter');
  await expect(page.getByTestId('focus-view')).toBeVisible();
  await expect(page.getByTestId('focus-question-where')).toHaveAttribute('aria-selected', 'true');
  await expect(page.getByTestId('focus-topography')).toBeVisible();
  await expect(page.getByTestId('focus-variance-map')).toBeVisible();
  await expect(page.getByTestId('focus-answer-where')).toContainText('Rules that fired');
  // The answer's evidence table exports as a real SVG figure (issue 14 item 11): sized, with every row.
  {
    const rowLabels = await page
      .getByTestId('focus-evidence-where')
      .locator('tbody th')
      .evaluateAll((ths) => ths.map((th) => (th.firstChild?.textContent ?? '').replace(/\s+/g, ' ').trim()));
    expect(rowLabels.length).toBeGreaterThan(2);
    const [svgDownload] = await Promise.all([page.waitForEvent('download'), page.getByTestId('focus-evidence-where-svg').click()]);
    expect(svgDownload.suggestedFilename()).toBe('sub-01_task-walkoddball_winnow-component-01-evidence-where.svg');
    const svg = await readFile(await svgDownload.path(), 'utf8');
    const size = /<svg[^>]*\swidth="(\d+(?:\.\d+)?)"[^>]*\sheight="(\d+(?:\.\d+)?)"/.exec(svg) ?? /<svg[^>]*\sheight="(\d+(?:\.\d+)?)"[^>]*\swidth="(\d+(?:\.\d+)?)"/.exec(svg);
    expect(size).not.toBeNull();
    expect(Number(size![1])).toBeGreaterThan(100);
    expect(Number(size![2])).toBeGreaterThan(100);
    const text = svg.replace(/&lt;/g, '<').replace(/&gt;/g, '>').replace(/&amp;/g, '&');
    for (const label of rowLabels) expect(text, `row “${label}” in the exported figure`).toContain(label);
  }
  await page.getByTestId('focus-question-where').focus();
  await page.keyboard.press('ArrowDown');
  await expect(page.getByTestId('focus-question-when')).toBeFocused();
  await expect(page.getByTestId('focus-answer-when')).toContainText('Time course and sensors');
  await page.keyboard.press('ArrowDown');
  await expect(page.getByTestId('focus-question-locked')).toBeFocused();
  await expect(page.getByTestId('focus-trial-stack')).toBeVisible();
  // Events chosen by BIDS events.tsv columns: every tone, then only the rare ones (condition column), then split by it.
  const trials = page.getByTestId('focus-trial-summary');
  await expect(page.getByTestId('focus-lock-type')).toHaveValue('tone');
  const allTones = Number(await trials.getAttribute('data-epochs'));
  expect(allTones).toBeGreaterThan(20);
  await page.getByTestId('focus-lock-only').selectOption('condition=rare');
  await expect(page.getByTestId('focus-lock-words')).toContainText('tone, condition rare');
  const rareTones = Number(await trials.getAttribute('data-epochs'));
  expect(rareTones).toBeGreaterThan(2);
  expect(rareTones).toBeLessThan(allTones / 2);
  await page.getByTestId('focus-lock-only').selectOption('');
  await page.getByTestId('focus-lock-split').selectOption('condition');
  await expect(trials).toHaveAttribute('data-groups', '2');
  await expect(trials).toHaveAttribute('data-epochs', String(allTones));
  await page.screenshot({ path: 'test-results/focus-locked.png', fullPage: true });
  await page.getByTestId('focus-question-locked').focus();
  await page.keyboard.press('ArrowDown');
  await expect(page.getByTestId('focus-question-frequencies')).toBeFocused();
  await expect(page.getByTestId('focus-spectrum')).toBeVisible();
  await page.screenshot({ path: 'test-results/focus.png', fullPage: true });
  await page.keyboard.press('Escape');
  await expect(page.getByTestId('board')).toBeVisible();

  // Export the decisions and check the file.
  await page.getByTestId('export-open').click();
  const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId('export-decisions-json').click()]);
  const exportedPath = await download.path();
  const exported = JSON.parse(await readFile(exportedPath, 'utf8'));
  expect(exported.format).toBe('winnow-decisions/2');
  expect(exported.aim).toBe('erp');
  expect(exported.recordingSha256).toMatch(/^[0-9a-f]{64}$/);
  expect(exported.decompositionSha256).toMatch(/^[0-9a-f]{64}$/);
  expect(exported.components).toHaveLength(n);
  expect(exported.components[0]).toMatchObject({ index: 1, verdict: 'remove', reason: 'blink', note: 'frontal, blink-shaped <b>not html</b>' });
  expect(exported.components[0].suggested).toHaveProperty('because');
  expect(exported.components[1]).toMatchObject({ index: 2, verdict: 'undecided', reason: null, note: '' });
  const [tsvDownload] = await Promise.all([page.waitForEvent('download'), page.getByTestId('export-decisions-tsv').click()]);
  const tsv = await readFile(await tsvDownload.path(), 'utf8');
  expect(tsv.split('\n')[0]).toBe('index\tverdict\treason\tnote');
  expect(tsv.split('\n')[1]).toBe('1\tremove\tblink\tfrontal, blink-shaped <b>not html</b>');
  await page.getByTestId('show-methods').click();
  await expect(page.getByTestId('methods-text')).toContainText(`1 of ${n} components were removed — 1 (blink)`);
  // The cleaned recording, written in a worker: an EDF+ file with the identifying fields blanked.
  const [edfDownload] = await Promise.all([page.waitForEvent('download', { timeout: 60_000 }), page.getByTestId('export-cleaned').click()]);
  expect(edfDownload.suggestedFilename()).toMatch(/_cleaned\.edf$/);
  const edf = await readFile(await edfDownload.path());
  expect(edf.subarray(0, 8).toString('latin1')).toBe('0       ');
  // EDF+ anonymous patient field "X X X X" (Kemp & Olivan 2003, EDF+ §2.1.3.3) and "EDF+C" in the reserved field.
  expect(edf.subarray(8, 88).toString('latin1').trim()).toBe('X X X X');
  expect(edf.subarray(192, 197).toString('latin1')).toBe('EDF+C');
  {
    // The removed component is gone and the kept ones are intact (docs/methods.md §7.6): with W A = I,
    // X_clean = X − A[:,R] W[R,:] (X − m) gives W[r,:] (X_clean − m) = 0 for r in R and W[k,:] X_clean = W[k,:] X
    // otherwise. Both files are read with the core EDF reader; the only allowed residue is what writing EDF
    // must leave: each 16-bit sample rounded to half its digital step (EDF spec, Kemp et al. 1992) plus float32
    // rounding, carried through the row: Σ_j |W_rj| (Δ_j/2 + 2⁻²³ |x_j|).
    const { bytesByteSource } = await import('../src/core/formats/byte-source.ts');
    const { readEdfInfo, readEdfSignals } = await import('../src/core/formats/edf.ts');
    const { parseDecompositionJson } = await import('../src/core/formats/decomposition-file.ts');
    const demoDir = new URL('../demo-data/sub-01/eeg/', import.meta.url);
    const decName = 'sub-01_task-walkoddball_desc-ica_decomposition.json';
    const dec = parseDecompositionJson(await readFile(new URL(decName, demoDir), 'utf8'), decName);
    if (!dec.ok) throw new Error(dec.error.message);
    const { channels, nChannels: nc, nComponents: k, mixing: A, unmixing: W } = dec.value;
    const means = dec.value.channelMeans ?? new Float64Array(nc);
    for (let r = 0; r < k; r++)
      for (let q = 0; q < k; q++) {
        let s = 0;
        for (let j = 0; j < nc; j++) s += W[r * nc + j] * A[j * k + q];
        expect(Math.abs(s - (r === q ? 1 : 0))).toBeLessThan(1e-6); // precondition W A = I
      }
    const read = async (bytes: Uint8Array, name: string) => {
      const src = bytesByteSource(bytes, name);
      const info = await readEdfInfo(src);
      if (!info.ok) throw new Error(info.error.message);
      const block = await readEdfSignals(src, info.value, { channels: [...channels] });
      if (!block.ok) throw new Error(block.error.message);
      const byLabel = new Map(info.value.channels.map((c) => [c.label, c] as const));
      const step = channels.map((l) => {
        const c = byLabel.get(l)!;
        return (c.physicalMax - c.physicalMin) / (c.digitalMax - c.digitalMin);
      });
      return { block: block.value, step };
    };
    const orig = await read(await readFile(new URL('sub-01_task-walkoddball_eeg.edf', demoDir)), 'demo.edf');
    const clean = await read(new Uint8Array(edf), 'cleaned.edf');
    const T = orig.block.nSamples;
    expect(clean.block.nSamples).toBe(T);
    expect([...clean.block.labels]).toEqual([...orig.block.labels]);
    const X = orig.block.data;
    const Y = clean.block.data;
    const worst = (r: number, x: Float32Array, t: number) => {
      let b = 0;
      for (let j = 0; j < nc; j++) b += Math.abs(W[r * nc + j]) * (clean.step[j] / 2 + Math.abs(x[j * T + t]) * 2 ** -23);
      return b;
    };
    const rms = (v: Float64Array) => Math.sqrt(v.reduce((s, x) => s + x * x, 0) / v.length);
    for (let r = 0; r < k; r++) {
      const before = new Float64Array(T);
      const after = new Float64Array(T);
      let maxExcess = -Infinity;
      for (let t = 0; t < T; t++) {
        let sx = 0;
        let sy = 0;
        for (let j = 0; j < nc; j++) {
          sx += W[r * nc + j] * (X[j * T + t] - means[j]);
          sy += W[r * nc + j] * (Y[j * T + t] - means[j]);
        }
        before[t] = sx;
        after[t] = sy;
        const target = r === 0 ? 0 : sx; // component 1 was removed above
        maxExcess = Math.max(maxExcess, Math.abs(sy - target) - worst(r, Y, t) - (r === 0 ? 0 : worst(r, X, t)));
      }
      expect(maxExcess, `component ${r + 1}: |W_r X_clean − expected| beyond the EDF rounding bound`).toBeLessThanOrEqual(1e-9);
      if (r === 0) {
        test.info().annotations.push({ type: 'removed component 1', description: `rms after / before ${(rms(after) / rms(before)).toExponential(2)}` });
        expect(rms(after) / rms(before), 'removed component: rms after / before').toBeLessThan(0.01);
      }
    }
  }
  await page.keyboard.press('Escape');

  // Reload: the saved review is offered and restored.
  const m = await openDemo(page);
  expect(m).toBe(n);
  await page.getByTestId('resume-accept').click();
  expect(await verdictOf(page, 1)).toBe('remove');
  await page.getByTestId('tile-1').click();
  await expect(page.getByTestId('note-field')).toHaveValue('frontal, blink-shaped <b>not html</b>');

  // Keyboard only: move, decide, cycle reason, note, undo/redo.
  await page.locator('body').focus();
  await page.keyboard.press('Home');
  await page.keyboard.press('ArrowRight');
  await page.keyboard.press('x');
  await expect(page.getByTestId('tile-2')).toHaveAttribute('data-verdict', 'remove');
  await page.keyboard.press('r');
  await expect(page.getByTestId('reason-select')).toHaveValue('blink');
  await page.keyboard.press('r');
  await expect(page.getByTestId('reason-select')).toHaveValue('gaze');
  await page.keyboard.press('ArrowRight');
  await page.keyboard.press('k');
  await expect(page.getByTestId('tile-3')).toHaveAttribute('data-verdict', 'keep');
  await page.keyboard.press('Control+z');
  await expect(page.getByTestId('tile-3')).toHaveAttribute('data-verdict', 'undecided');
  await page.keyboard.press('Control+Shift+Z');
  await expect(page.getByTestId('tile-3')).toHaveAttribute('data-verdict', 'keep');
  await page.keyboard.press('n');
  await expect(page.getByTestId('note-field')).toBeFocused();
  await page.keyboard.type('typed with keys');
  await page.keyboard.press('Escape');
  await expect(page.getByTestId('tile-3')).toContainText('typed with keys');
  await page.keyboard.press('?');
  await expect(page.getByTestId('help-panel')).toBeVisible();
  await page.keyboard.press('Escape');
  await expect(page.getByTestId('help-panel')).toBeHidden();
  await page.keyboard.press('f');
  await expect(page.getByTestId('focus-view')).toBeVisible();
  await page.keyboard.press('b');
  await expect(page.getByTestId('board')).toBeVisible();
  // Tab reaches the controls: from the selected tile, Tab walks on to other tiles and the decision panel.
  await page.getByTestId('tile-3').focus();
  await page.keyboard.press('Shift+Tab');
  await expect(page.getByTestId('tile-2')).toBeFocused();

  const state = {
    1: await verdictOf(page, 1), 2: await verdictOf(page, 2), 3: await verdictOf(page, 3),
    counter: await page.getByTestId('board-counter').innerText(),
  };
  await page.keyboard.press('e');
  const [download2] = await Promise.all([page.waitForEvent('download'), page.getByTestId('export-decisions-json').click()]);
  const decisionsPath = await download2.path();

  // A fresh session (new browser context: empty IndexedDB) imports the file and shows the same state.
  const fresh = await browser.newContext();
  const page2 = await fresh.newPage();
  watchOrigin(page2, offOrigin);
  await openDemo(page2);
  await expect(page2.getByTestId('resume-banner')).toHaveCount(0);
  await page2.getByTestId('export-open').click();
  await page2.getByTestId('import-decisions').setInputFiles({ name: 'sub-01_decisions.json', mimeType: 'application/json', buffer: await readFile(decisionsPath) });
  await expect(page2.getByTestId('board-counter')).toHaveText(state.counter);
  expect({ 1: await verdictOf(page2, 1), 2: await verdictOf(page2, 2), 3: await verdictOf(page2, 3) }).toEqual({ 1: state[1], 2: state[2], 3: state[3] });
  await page2.keyboard.press('Escape');
  await page2.getByTestId('tile-3').click();
  await expect(page2.getByTestId('note-field')).toHaveValue('typed with keys');
  await fresh.close();

  expect(offOrigin).toEqual([]);
});
