/** Issue 2: the page opens, a dropped EDF file is read in the browser and its channels are listed. */
import { expect, test } from '@playwright/test';
import { tinyEdf } from './edf-bytes.ts';

test('dropping an EDF file on the page lists its channels, rate, duration and format', async ({ page }) => {
  const offOrigin: string[] = [];
  page.on('request', (r) => {
    const url = new URL(r.url());
    if ((url.protocol === 'http:' || url.protocol === 'https:') && url.origin !== (process.env.WINNOW_E2E_ORIGIN ?? 'http://127.0.0.1:4173')) offOrigin.push(r.url());
  });
  await page.goto('/?demo=0');
  await expect(page.getByRole('heading', { name: 'Winnow' })).toBeVisible();
  await expect(page.getByText('not for clinical diagnosis').first()).toBeVisible();
  await expect(page.getByText(/nothing is uploaded/).first()).toBeVisible();

  const labels = ['Fp1', 'Fp2', 'Cz', 'O1'];
  const bytes = Array.from(tinyEdf({ labels, sampleRate: 128, records: 3 }));
  const dataTransfer = await page.evaluateHandle((b) => {
    const dt = new DataTransfer();
    dt.items.add(new File([new Uint8Array(b)], 'sub-07_task-rest_eeg.edf', { type: 'application/octet-stream' }));
    return dt;
  }, bytes);
  await page.dispatchEvent('[data-testid="drop-zone"]', 'drop', { dataTransfer });

  const list = page.getByTestId('channel-list');
  await expect(list).toBeVisible();
  for (const label of labels) await expect(list.getByRole('cell', { name: label, exact: true })).toBeVisible();
  await expect(page.getByTestId('recording-rates')).toHaveText('128 Hz');
  await expect(page.getByTestId('recording-duration')).toContainText('3.00 s');
  await expect(page.getByTestId('recording-format')).toHaveText('EDF');
  await expect(page.getByTestId('decompose-form')).toBeVisible();
  expect(offOrigin).toEqual([]);
});

test('a file dropped anywhere on the page is opened, not shown in place of the page', async ({ page }) => {
  await page.goto('/?demo=0');
  const bytes = Array.from(tinyEdf({ labels: ['C3', 'C4'], sampleRate: 64, records: 2 }));
  const dataTransfer = await page.evaluateHandle((b) => {
    const dt = new DataTransfer();
    dt.items.add(new File([new Uint8Array(b)], 'sub-08_eeg.edf'));
    return dt;
  }, bytes);
  await page.dispatchEvent('header', 'drop', { dataTransfer });
  await expect(page.getByTestId('channel-list').getByRole('cell', { name: 'C4', exact: true })).toBeVisible();
  expect(page.url()).toContain(new URL(process.env.WINNOW_E2E_ORIGIN ?? 'http://127.0.0.1:4173').host);
});

// Both methods: Picard's second thread must never hang the run in a browser (it falls back to one thread).
for (const method of ['infomax', 'picard'] as const) {
  test(`without a decomposition the page computes one (${method}), with progress, and opens the board`, async ({ page }) => {
    await page.goto('/?demo=0');
    const labels = ['Fp1', 'Fp2', 'F3', 'F4', 'C3', 'C4', 'O1', 'O2'];
    const bytes = Array.from(tinyEdf({ labels, sampleRate: 128, records: 40, noiseUv: 20 }));
    const dataTransfer = await page.evaluateHandle((b) => {
      const dt = new DataTransfer();
      dt.items.add(new File([new Uint8Array(b)], 'sub-09_eeg.edf'));
      return dt;
    }, bytes);
    await page.dispatchEvent('[data-testid="drop-zone"]', 'drop', { dataTransfer });
    await page.getByTestId('decompose-method').selectOption(method);
    await page.getByTestId('decompose-seed').fill('3');
    // Record every progress text shown (the run may finish between two polls of an assertion).
    await page.evaluate(() => {
      const seen: string[] = [];
      (window as unknown as { progressSeen: string[] }).progressSeen = seen;
      new MutationObserver(() => {
        const el = document.querySelector('[data-testid="progress"]');
        if (el?.textContent) seen.push(el.textContent);
      }).observe(document.body, { subtree: true, childList: true, characterData: true, attributes: true });
    });
    await page.getByTestId('decompose-run').click();
    await expect(page.getByTestId('board')).toBeVisible({ timeout: 60_000 });
    const seen = await page.evaluate(() => (window as unknown as { progressSeen: string[] }).progressSeen);
    expect(seen.some((t) => t.includes(`Decomposing (${method}, seed 3`) && t.includes('Cancel'))).toBe(true);
    expect(seen.some((t) => t.includes('Computing evidence'))).toBe(true);
    await expect(page.locator('[data-testid^="tile-"]')).toHaveCount(8);
    await page.getByTestId('export-open').click();
    await expect(page.getByTestId('export-decomposition')).toBeVisible();
  });
}
