/**
 * Issue 14, items 1–5: nothing the reviewer did is lost. Reloads at chosen moments (50 ms after a decision,
 * after typing a note), a resume offer left open while deciding, start afresh then restore the earlier
 * snapshot from the start page, cancel while evidence is computed then compute it again, a decisions TSV
 * that would replace work, and two tabs on the same participant. All on the simulated demo participant.
 */
import { expect, test, type Page } from '@playwright/test';
import { tinyEdf } from './edf-bytes.ts';

/** Demo load = read + decomposition + evidence in the browser. */
const LOAD_TIMEOUT = 75_000;

async function openDemo(page: Page): Promise<void> {
  await page.goto('/?demo=1');
  await expect(page.getByTestId('board')).toBeVisible({ timeout: LOAD_TIMEOUT });
}

async function reloadToBoard(page: Page): Promise<void> {
  await page.reload();
  await expect(page.getByTestId('board')).toBeVisible({ timeout: LOAD_TIMEOUT });
}

async function decide(page: Page, i: number, verdict: 'keep' | 'remove') {
  await page.getByTestId(`tile-${i}`).click();
  await page.getByTestId(`verdict-${verdict}`).click();
  await expect(page.getByTestId(`tile-${i}`)).toHaveAttribute('data-verdict', verdict);
}

const verdictOf = (page: Page, i: number) => page.getByTestId(`tile-${i}`).getAttribute('data-verdict');

test('a reload 50 ms after a decision, and 50 ms after typing a note, keeps both', async ({ page }) => {
  test.setTimeout(200_000);
  await openDemo(page);
  await decide(page, 1, 'remove');
  await page.waitForTimeout(50);
  await reloadToBoard(page);
  await expect(page.getByTestId('resume-banner')).toContainText('1 decided');
  await page.getByTestId('resume-accept').click();
  expect(await verdictOf(page, 1)).toBe('remove');

  // A note typed and not yet committed by the field (it commits after a pause or on leaving it).
  await page.getByTestId('tile-2').click();
  await page.getByTestId('note-field').click();
  await page.keyboard.type('typed just before the reload');
  await page.waitForTimeout(50);
  await reloadToBoard(page);
  await page.getByTestId('resume-accept').click();
  expect(await verdictOf(page, 1)).toBe('remove');
  await page.getByTestId('tile-2').click();
  await expect(page.getByTestId('note-field')).toHaveValue('typed just before the reload');
  // Undo never reaches back past a resume.
  await expect(page.getByTestId('undo')).toBeDisabled();
});

test('decisions made while the resume offer is left open are saved, and the offered review is kept too', async ({ page }) => {
  test.setTimeout(200_000);
  await openDemo(page);
  await decide(page, 1, 'remove');
  await reloadToBoard(page);
  await expect(page.getByTestId('resume-banner')).toBeVisible();
  // The offer stays unanswered; four decisions on the board meanwhile.
  for (const i of [2, 3, 4, 5]) await decide(page, i, 'keep');
  await page.waitForTimeout(50);
  await reloadToBoard(page);
  await expect(page.getByTestId('resume-banner')).toContainText('4 decided');
  await page.getByTestId('resume-accept').click();
  for (const i of [2, 3, 4, 5]) expect(await verdictOf(page, i)).toBe('keep');
  // The review that was offered the first time is still in the history on the start page.
  await page.getByTestId('screen-start').click();
  await expect(page.getByTestId('saved-reviews')).toBeVisible();
  await page.getByTestId('saved-participant').first().locator('summary').click();
  await expect(page.getByTestId('saved-snapshot').filter({ hasText: '1 decided' })).toHaveCount(1);
  await expect(page.getByTestId('saved-snapshot').filter({ hasText: '4 decided' })).toHaveCount(1);
});

test('start afresh asks first, and the earlier review is restored from the start page', async ({ page }) => {
  test.setTimeout(200_000);
  await openDemo(page);
  await decide(page, 1, 'remove');
  await decide(page, 2, 'remove');
  await reloadToBoard(page);
  // Item 5: the start page says a saved review exists.
  await page.getByTestId('screen-start').click();
  await expect(page.getByTestId('saved-participant')).toContainText('2 of');
  await page.getByTestId('screen-board').click();

  await page.getByTestId('resume-decline').click();
  await expect(page.getByTestId('confirm-replaces')).toContainText('2 decided');
  await expect(page.getByTestId('confirm-replaces')).toContainText('not deleted');
  await page.getByTestId('confirm-ok').click();
  await expect(page.getByTestId('resume-banner')).toHaveCount(0);
  expect(await verdictOf(page, 1)).toBe('undecided');
  await decide(page, 3, 'keep');

  await page.getByTestId('screen-start').click();
  await page.getByTestId('saved-participant').first().locator('summary').click();
  const earlier = page.getByTestId('saved-snapshot').filter({ hasText: '2 decided' });
  await expect(earlier).toHaveCount(1);
  await earlier.getByTestId('snapshot-restore').click();
  await expect(page.getByTestId('confirm-replaces')).toContainText('1 decided');
  await page.getByTestId('confirm-ok').click();
  await expect(page.getByTestId('board')).toBeVisible();
  expect(await verdictOf(page, 1)).toBe('remove');
  expect(await verdictOf(page, 2)).toBe('remove');
  expect(await verdictOf(page, 3)).toBe('undecided');
  await expect(page.getByTestId('undo')).toBeDisabled();

  // The afresh review (component 3 kept) was not lost either.
  await page.getByTestId('screen-start').click();
  await page.getByTestId('saved-participant').first().locator('summary').click();
  await expect(page.getByTestId('saved-snapshot').filter({ hasText: '1 decided' })).toHaveCount(1);

  // A decisions TSV carries no hashes: importing one over the review asks first, and cancelling keeps the review.
  await page.getByTestId('screen-board').click();
  await page.getByTestId('export-open').click();
  await page.getByTestId('import-decisions').setInputFiles({
    name: 'sub-99_decisions.tsv', mimeType: 'text/tab-separated-values', buffer: Buffer.from('index\tverdict\treason\tnote\n1\tkeep\tneural\t\n'),
  });
  await expect(page.getByTestId('confirm-replaces')).toContainText('TSV file carries no recording or decomposition hash');
  await page.getByTestId('confirm-cancel').click();
  expect(await verdictOf(page, 1)).toBe('remove');
});

test('cancel while the evidence is computed lands on a page that computes it again from what is loaded', async ({ page }) => {
  test.setTimeout(200_000);
  await page.goto('/?demo=1');
  await expect(page.getByTestId('progress')).toContainText('Computing evidence', { timeout: LOAD_TIMEOUT });
  await page.getByTestId('progress-cancel').click();
  await expect(page.getByTestId('progress')).toHaveCount(0);
  await expect(page.getByTestId('start-screen')).toBeVisible();
  await expect(page.getByTestId('recompute-panel')).toBeVisible();
  await page.getByTestId('recompute-evidence').click();
  await expect(page.getByTestId('board')).toBeVisible({ timeout: LOAD_TIMEOUT });
  await expect(page.getByTestId('screen-preview')).toBeEnabled();
  await expect(page.getByTestId('export-open')).toBeEnabled();
  await decide(page, 1, 'remove');
});

test('a second tab on the same participant is told which tab owns the review', async ({ context }) => {
  test.setTimeout(200_000);
  const first = await context.newPage();
  await openDemo(first);
  const second = await context.newPage();
  await openDemo(second);
  await expect(second.getByTestId('tab-clash')).toHaveAttribute('data-owner', 'other');
  await expect(second.getByTestId('tab-clash')).toContainText('already open in another tab');
  await expect(second.getByTestId('tab-clash')).toContainText(/opened it at .* \(tab [a-z0-9]{4}\) owns the review/);
  await expect(first.getByTestId('tab-clash')).toHaveAttribute('data-owner', 'this');
  // Both tabs' decisions are kept (each in its own snapshot).
  await decide(first, 1, 'remove');
  await decide(second, 2, 'keep');
  // The owner closes: the second tab takes over.
  await first.close();
  await expect(second.getByTestId('tab-clash')).toHaveCount(0);
  await expect(second.getByTestId('notice')).toContainText('this tab owns the review now');
  await second.getByTestId('screen-start').click();
  await second.getByTestId('saved-participant').first().locator('summary').click();
  await expect(second.getByTestId('saved-snapshot')).toHaveCount(2);
});

test('opening another recording mid-review asks first; the review is listed and reopens from the start page', async ({ page }) => {
  test.setTimeout(200_000);
  await openDemo(page);
  await decide(page, 1, 'remove');
  await page.getByTestId('screen-start').click();
  const other = { name: 'sub-08_eeg.edf', mimeType: 'application/octet-stream', buffer: Buffer.from(tinyEdf({ labels: ['Fz', 'Cz', 'Pz', 'C4'], sampleRate: 128, records: 4, noiseUv: 5 })) };
  await page.getByTestId('recording-input').setInputFiles(other);
  await expect(page.getByTestId('confirm-replaces')).toContainText('1 decided');
  await page.getByTestId('confirm-cancel').click();
  await expect(page.getByTestId('back-to-board')).toBeVisible();
  await page.getByTestId('recording-input').setInputFiles(other);
  await page.getByTestId('confirm-ok').click();
  await expect(page.getByTestId('channel-list').getByRole('cell', { name: 'C4', exact: true })).toBeVisible();
  // The demo participant's review is listed (participant, when, n decided) and reopens on the board.
  const saved = page.getByTestId('saved-participant');
  await expect(saved).toHaveCount(1);
  await expect(saved).toContainText('1 of');
  await saved.getByTestId('saved-reopen').click();
  await expect(page.getByTestId('board')).toBeVisible({ timeout: LOAD_TIMEOUT });
  expect(await verdictOf(page, 1)).toBe('remove');
  await expect(page.getByTestId('notice')).toContainText('Restored the review saved');
});

test('storage full: the reviewer is told in words and the export is offered; a damaged saved record is named, the rest recovered', async ({ page }) => {
  test.setTimeout(200_000);
  // The browser's quota runs out once the page sets window.__storageFull (a QuotaExceededError, as IndexedDB reports it).
  await page.addInitScript(() => {
    const put = IDBObjectStore.prototype.put;
    IDBObjectStore.prototype.put = function (this: IDBObjectStore, value: unknown, key?: IDBValidKey) {
      if ((window as unknown as { __storageFull?: boolean }).__storageFull && this.name === 'snapshots') {
        const full = new DOMException('The quota has been exceeded.', 'QuotaExceededError');
        Object.defineProperty(this.transaction, 'error', { value: full });
        this.transaction.abort();
        throw full;
      }
      return put.call(this, value, key);
    };
  });
  await openDemo(page);
  await decide(page, 1, 'remove');
  await page.evaluate(() => { (window as unknown as { __storageFull?: boolean }).__storageFull = true; });
  await decide(page, 2, 'keep');
  const problem = page.getByTestId('save-problem');
  await expect(problem).toHaveAttribute('data-kind', 'full');
  await expect(problem).toContainText('storage for Winnow is full');
  const [download] = await Promise.all([page.waitForEvent('download'), problem.getByTestId('save-problem-export').click()]);
  expect(download.suggestedFilename()).toMatch(/_decisions\.json$/);
  // Space is back: the next change is saved and the message goes.
  await page.evaluate(() => { (window as unknown as { __storageFull?: boolean }).__storageFull = false; });
  await decide(page, 3, 'keep');
  await expect(problem).toHaveCount(0);

  // A record damaged behind Winnow's back: the start page says what was lost and lists the rest.
  await page.evaluate(() => new Promise<void>((resolve, reject) => {
    const open = indexedDB.open('winnow-reviews');
    open.onsuccess = () => {
      const tx = open.result.transaction('snapshots', 'readwrite');
      tx.objectStore('snapshots').put({ id: 'x:y#damaged', key: 'x:y', savedAt: 17, decisions: null });
      tx.oncomplete = () => { open.result.close(); resolve(); };
      tx.onerror = () => reject(tx.error);
    };
    open.onerror = () => reject(open.error);
  }));
  await reloadToBoard(page);
  await page.getByTestId('screen-start').click();
  await expect(page.getByTestId('lost-notice')).toContainText('could not be read');
  await expect(page.getByTestId('lost-notice')).toContainText('Everything else was recovered');
  await expect(page.getByTestId('saved-participant')).toContainText('3 of');
});
