/**
 * Screens at 1280 × 720 (issue 15): screenshot comparisons of the board, the focus view and the preview
 * against committed baselines (a layout regression shows as a failed comparison), no horizontal scrolling
 * and every panel reachable at that size, and the board worked with the keyboard alone.
 *
 * Baselines live in e2e/screens.spec.ts-snapshots/. After a deliberate layout change regenerate them with
 *   npx vite build && npx playwright test e2e/screens.spec.ts --update-snapshots
 * and commit the new pictures with the change.
 */
import { expect, test, type Page } from '@playwright/test';
import { readFile } from 'node:fs/promises';
import { tinyEdf } from './edf-bytes.ts';

/** Demo load = read + decomposition + evidence in the browser. */
const LOAD_TIMEOUT = 75_000;
/** Share of pixels allowed to differ (antialiasing and font hinting; a moved panel changes far more). */
const TOLERANCE = { maxDiffPixelRatio: 0.02, threshold: 0.2, animations: 'disabled', caret: 'hide' } as const;

test.use({ viewport: { width: 1280, height: 720 } });
test.describe.configure({ mode: 'serial' });

async function openDemo(page: Page): Promise<number> {
  await page.goto('/?demo=1');
  await expect(page.getByTestId('board')).toBeVisible({ timeout: LOAD_TIMEOUT });
  const m = /(\d+) \/ (\d+)/.exec(await page.getByTestId('board-counter').innerText());
  expect(m).not.toBeNull();
  await expect(page.locator('[data-testid^="tile-"]')).toHaveCount(Number(m![2]));
  return Number(m![2]);
}

/** Nothing is wider than the window: no horizontal scroll bar on the page. */
async function expectNoHorizontalScroll(page: Page, screen: string) {
  const { scrollWidth, clientWidth } = await page.evaluate(() => ({
    scrollWidth: document.documentElement.scrollWidth,
    clientWidth: document.documentElement.clientWidth,
  }));
  expect(scrollWidth, `${screen}: page ${scrollWidth} px wide in a ${clientWidth} px window`).toBeLessThanOrEqual(clientWidth);
}

/** Every panel can be scrolled to and lies inside the window's width once there. */
async function expectPanelsReachable(page: Page, screen: string) {
  const panels = page.locator('section.panel');
  const count = await panels.count();
  expect(count, `${screen}: panels`).toBeGreaterThan(0);
  for (let i = 0; i < count; i++) {
    const p = panels.nth(i);
    await p.scrollIntoViewIfNeeded();
    const box = await p.boundingBox();
    expect(box, `${screen}: panel ${i} has a box`).not.toBeNull();
    const name = (await p.getAttribute('aria-label')) ?? String(i);
    expect(box!.x, `${screen}: panel "${name}" starts inside the window`).toBeGreaterThanOrEqual(0);
    expect(box!.x + box!.width, `${screen}: panel "${name}" ends inside the window`).toBeLessThanOrEqual(1280 + 1);
  }
  await page.evaluate(() => window.scrollTo(0, 0));
}

test('board, focus and preview at 1280 × 720: screenshots, no horizontal scroll, panels reachable', async ({ page }) => {
  test.setTimeout(180_000);
  await openDemo(page);

  // Board
  await expectNoHorizontalScroll(page, 'board');
  await expect(page).toHaveScreenshot('board.png', TOLERANCE);

  // Focus view of component 1
  await page.getByTestId('tile-1').click();
  await page.keyboard.press('f');
  await expect(page.getByTestId('focus-view')).toBeVisible();
  await page.waitForLoadState('networkidle');
  await page.waitForTimeout(1500); // maps and the trial stack paint after the first frame
  await expectNoHorizontalScroll(page, 'focus');
  await expectPanelsReachable(page, 'focus');
  await expect(page).toHaveScreenshot('focus.png', TOLERANCE);

  // Preview: the strip, the µV-per-division scale, whole-recording spectra
  await page.getByTestId('screen-preview').click();
  await expect(page.getByTestId('preview-cleaned-checksum')).toHaveText(/^[0-9a-f]{8}$/, { timeout: 30_000 });
  await expect(page.getByTestId('preview-erp-before')).not.toHaveText('…', { timeout: 30_000 });
  await expect(page.getByTestId('preview-spectra-note')).toHaveAttribute('aria-busy', 'false', { timeout: 30_000 });
  await expect(page.getByTestId('preview-scale')).toHaveText(/^\d+(\.\d+)?\u00a0µV\/div$/);
  await expect(page.getByTestId('preview-mode')).toHaveText('side by side');
  // the residual check runs in a worker: wait for its notice, so the picture does not depend on timing
  await expect(page.getByTestId('residual-notice')).toContainText('remains', { timeout: 30_000 });
  await expectNoHorizontalScroll(page, 'preview');
  await expectPanelsReachable(page, 'preview');
  await expect(page).toHaveScreenshot('preview.png', TOLERANCE);
});

test('the preview strip removes and restores a component while the cleaned signal is watched', async ({ page }) => {
  test.setTimeout(120_000);
  await openDemo(page);
  await page.getByTestId('screen-preview').click();
  const checksum = page.getByTestId('preview-cleaned-checksum');
  await expect(checksum).toHaveText(/^[0-9a-f]{8}$/, { timeout: 30_000 });
  const before = (await checksum.textContent()) ?? '';
  const toggle = page.getByTestId('preview-strip-toggle-1');
  await toggle.focus();
  await page.keyboard.press('Enter'); // keyboard alone
  await expect(toggle).toHaveAttribute('aria-pressed', 'true');
  await expect(page.getByTestId('preview-removed-count')).toHaveText('1');
  await expect(checksum).not.toHaveText(before);
  await expect(page.getByTestId('preview-strip-1')).toHaveAttribute('data-verdict', 'remove');
  await page.getByTestId('preview-strip-select-1').click();
  await expect(page.getByTestId('preview-strip-1')).toHaveAttribute('aria-current', 'true');
  await toggle.click();
  await expect(page.getByTestId('preview-strip-1')).toHaveAttribute('data-verdict', 'keep');

  // An exported figure carries the participant in its name and keeps its caption.
  const spectra = page.locator('section.panel-region-spectra');
  const [download] = await Promise.all([page.waitForEvent('download'), spectra.getByRole('button', { name: 'SVG' }).click()]);
  expect(download.suggestedFilename()).toBe('sub-01_task-walkoddball_winnow-preview-spectra-before-after.svg');
  const svg = await readFile((await download.path())!, 'utf8');
  expect(svg).toContain('sub-01 task-walkoddball · preview · Spectra before / after');
  expect(svg).toContain('Welch PSD of the mean of');
  await expect(page.getByTestId('preview-removed-count')).toHaveText('0');
  await expect(checksum).toHaveText(before);
});

test('the preview strip is one Tab stop worked with the arrows, Home/End and Space', async ({ page }) => {
  test.setTimeout(120_000);
  const n = await openDemo(page);
  expect(n).toBeGreaterThan(3);
  await page.getByTestId('screen-preview').click();
  await expect(page.getByTestId('preview-cleaned-checksum')).toHaveText(/^[0-9a-f]{8}$/, { timeout: 30_000 });
  const strip = page.getByTestId('preview-strip');
  await expect(strip).toHaveAttribute('role', 'toolbar');
  // Roving tabindex (WAI-ARIA APG, Toolbar pattern): exactly one control of the strip is in the Tab order.
  await expect(strip.locator('[tabindex="0"]')).toHaveCount(1);
  const toggle = (i: number) => page.getByTestId(`preview-strip-toggle-${i}`);
  const focusedInStrip = () => page.evaluate(() => document.activeElement?.closest('[data-testid="preview-strip"]') !== null);
  // Tab from the control before the strip lands on the strip's one stop; the next Tab leaves it.
  await toggle(1).focus();
  await page.keyboard.press('Shift+Tab');
  expect(await focusedInStrip()).toBe(false);
  await page.keyboard.press('Tab');
  await expect(toggle(1)).toBeFocused();
  await page.keyboard.press('Tab');
  expect(await focusedInStrip()).toBe(false);
  await page.keyboard.press('Shift+Tab');
  await expect(toggle(1)).toBeFocused();
  // Arrows move (and the selection follows), Home/End jump, the ends stop.
  await page.keyboard.press('ArrowRight');
  await expect(toggle(2)).toBeFocused();
  await expect(page.getByTestId('preview-strip-2')).toHaveAttribute('aria-current', 'true');
  await expect(toggle(2)).toHaveAttribute('tabindex', '0');
  await expect(toggle(1)).toHaveAttribute('tabindex', '-1');
  await page.keyboard.press('ArrowDown');
  await expect(toggle(3)).toBeFocused();
  await page.keyboard.press('ArrowUp');
  await expect(toggle(2)).toBeFocused();
  await page.keyboard.press('End');
  await expect(toggle(n)).toBeFocused();
  await page.keyboard.press('ArrowRight');
  await expect(toggle(n)).toBeFocused();
  await page.keyboard.press('Home');
  await expect(toggle(1)).toBeFocused();
  await page.keyboard.press('ArrowLeft');
  await expect(toggle(1)).toBeFocused();
  // Space removes the focused component, Enter restores it.
  await page.keyboard.press('ArrowRight');
  await page.keyboard.press('Space');
  await expect(toggle(2)).toHaveAttribute('aria-pressed', 'true');
  await expect(page.getByTestId('preview-removed-count')).toHaveText('1');
  await expect(toggle(2)).toBeFocused();
  await page.keyboard.press('Enter');
  await expect(toggle(2)).toHaveAttribute('aria-pressed', 'false');
  await expect(page.getByTestId('preview-strip-2')).toHaveAttribute('data-verdict', 'keep');
  await expect(page.getByTestId('preview-removed-count')).toHaveText('0');
});

test('the board works with the keyboard alone at 1280 × 720', async ({ page }) => {
  test.setTimeout(120_000);
  const n = await openDemo(page);
  expect(n).toBeGreaterThan(2);
  await page.locator('body').click({ position: { x: 5, y: 700 } }); // focus the page, not a control
  await page.keyboard.press('Home');
  await page.keyboard.press('ArrowRight');
  await page.keyboard.press('x');
  await expect(page.getByTestId('tile-2')).toHaveAttribute('data-verdict', 'remove');
  await page.keyboard.press('r');
  await expect(page.getByTestId('reason-select')).toHaveValue('blink');
  await page.keyboard.press('ArrowLeft');
  await page.keyboard.press('k');
  await expect(page.getByTestId('tile-1')).toHaveAttribute('data-verdict', 'keep');
  await page.keyboard.press('Control+z');
  await expect(page.getByTestId('tile-1')).toHaveAttribute('data-verdict', 'undecided');
  // Tab reaches controls that are on screen, one after another, with a visible focus.
  for (let i = 0; i < 6; i++) {
    await page.keyboard.press('Tab');
    const box = await page.evaluate(() => {
      const el = document.activeElement as HTMLElement | null;
      if (!el || el === document.body) return null;
      el.scrollIntoView({ block: 'nearest', inline: 'nearest' });
      const r = el.getBoundingClientRect();
      return { x: r.x, right: r.right, w: r.width, h: r.height };
    });
    expect(box, `Tab ${i + 1} reaches a control`).not.toBeNull();
    expect(box!.w * box!.h, `Tab ${i + 1} reaches a visible control`).toBeGreaterThan(0);
    expect(box!.right, `Tab ${i + 1} stays inside the window`).toBeLessThanOrEqual(1281);
  }
  await page.keyboard.press('Escape');
  await page.locator('body').click({ position: { x: 5, y: 700 } });
  await page.keyboard.press('Enter');
  await expect(page.getByTestId('focus-view')).toBeVisible();
  await page.keyboard.press('b');
  await expect(page.getByTestId('board')).toBeVisible();
  await page.keyboard.press('p');
  await expect(page.getByTestId('preview-view')).toBeVisible();
  await page.keyboard.press('b');
  await page.keyboard.press('e');
  await expect(page.getByTestId('export-panel')).toBeVisible();
  await expect(page.getByTestId('export-undecided-warning')).toBeVisible();
  await page.keyboard.press('Escape');
  await expect(page.getByTestId('export-panel')).toHaveCount(0);
});

test('a recording without a decomposition: the summary states positions, reference and sidecars; each method shows its time here', async ({ page }) => {
  test.setTimeout(120_000);
  await page.goto('/?demo=0');
  const labels = ['Fp1', 'Fp2', 'C3', 'C4', 'O1', 'O2'];
  const bytes = Array.from(tinyEdf({ labels, sampleRate: 128, records: 40, noiseUv: 20 }));
  const channels = `name\ttype\tunits\treference\n${labels.map((l) => `${l}\tEEG\tuV\tCz`).join('\n')}\n`;
  const dataTransfer = await page.evaluateHandle(([b, tsv]) => {
    const dt = new DataTransfer();
    dt.items.add(new File([new Uint8Array(b as number[])], 'sub-07_task-rest_eeg.edf', { type: 'application/octet-stream' }));
    dt.items.add(new File([tsv as string], 'sub-07_task-rest_channels.tsv', { type: 'text/tab-separated-values' }));
    return dt;
  }, [bytes, channels] as const);
  await page.dispatchEvent('[data-testid="drop-zone"]', 'drop', { dataTransfer });
  await expect(page.getByTestId('decompose-form')).toBeVisible({ timeout: 30_000 });
  await expect(page.getByTestId('recording-positions')).toHaveText('6 of 6 EEG channels, idealised 10-20/10-10 positions by channel name (no electrodes.tsv)');
  await expect(page.getByTestId('recording-reference')).toHaveText('Cz (sub-07_task-rest_channels.tsv)');
  await expect(page.getByTestId('recording-sidecars')).toHaveText('sub-07_task-rest_channels.tsv (channels)');
  const method = page.getByTestId('decompose-method');
  await expect(method.locator('option[value="picard"]')).toHaveText(/^Picard — (about|at least|under) .+ here$|^Picard — under 1 s here$/, { timeout: 60_000 });
  await expect(method.locator('option[value="infomax"]')).toHaveText(/^extended Infomax — (about|at least|under) .+ here$/, { timeout: 60_000 });
});
