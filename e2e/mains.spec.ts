/**
 * Issue 10, mains from the recording: a 60 Hz recording with its *_eeg.json (PowerLineFrequency 60, BIDS
 * specification v1.11 "EEG sidecar") is opened through the file picker; the summary says 60 Hz, the evidence
 * counts power at 60 Hz and its harmonics, so the simulated mains source is suggested as mains. Overriding
 * the mains frequency with 50 Hz computes the evidence again at 50 Hz, where that component has no line
 * power left, and a mains-share threshold raised in the thresholds panel re-suggests at once. Choosing the
 * events.tsv column "condition" tests time-locking for each of its values too.
 */
import { expect, test, type Page } from '@playwright/test';
import { simulateSession } from '../src/core/simulate/simulate.ts';
import { sessionEdf, sessionSidecars } from '../src/core/simulate/session-files.ts';

const STEM = 'sub-01_task-walkoddball';

function recordingFiles() {
  const session = simulateSession({ lineHz: 60, minutes: 1, seed: 7 });
  const files = [{ name: `${STEM}_eeg.edf`, mimeType: 'application/octet-stream', buffer: Buffer.from(sessionEdf(session, 'data')) }];
  for (const s of sessionSidecars(session)) {
    files.push({ name: `${s.taskEntity ? STEM : 'sub-01'}_${s.suffix}`, mimeType: 'text/plain', buffer: Buffer.from(s.text) });
  }
  return files;
}

const mainsTiles = (page: Page) => page.locator('[data-testid^="tile-"][aria-label*="(mains)"]');

test('a 60 Hz recording: the summary says 60 Hz, the mains component is suggested as mains; 50 Hz override and thresholds re-suggest', async ({ page }) => {
  test.setTimeout(300_000);
  await page.goto('/?demo=0');
  await page.getByTestId('recording-input').setInputFiles(recordingFiles());
  await expect(page.getByTestId('recording-mains')).toHaveText(`mains 60 Hz (from ${STEM}_eeg.json)`);
  await expect(page.getByTestId('recording-sidecars')).toContainText(`${STEM}_eeg.json`);
  // The events.tsv factor columns are offered for time-locking per value.
  await expect(page.getByTestId('lock-column-select').locator('option')).toContainText(['no column (event types only)', 'condition (standard, rare)']);

  await page.getByTestId('decompose-run').click();
  await expect(page.getByTestId('board')).toBeVisible({ timeout: 240_000 });
  await expect(mainsTiles(page).first()).toBeVisible();
  const atSixty = await mainsTiles(page).count();
  expect(atSixty).toBeGreaterThanOrEqual(1);

  // The thresholds panel: a mains share threshold no component reaches removes the mains reading at once.
  await page.getByTestId('thresholds-open').click();
  await expect(page.getByTestId('threshold-row-mainsShare')).toContainText('ours');
  await page.getByTestId('threshold-input-mainsShare').fill('1');
  await expect(mainsTiles(page)).toHaveCount(0);
  await page.getByTestId('threshold-input-mainsShare').fill('7');
  await expect(page.getByTestId('threshold-row-mainsShare')).toContainText('must be between 0 and 1');
  await page.getByTestId('threshold-reset-mainsShare').click();
  await expect(mainsTiles(page)).toHaveCount(atSixty);
  await page.getByTestId('thresholds-close').click();

  // Override with 50 Hz: evidence computed again at 50 Hz; the 60 Hz component has no line power there.
  await page.getByTestId('screen-start').click();
  await page.getByTestId('mains-override').selectOption('50');
  await expect(page.getByTestId('board')).toBeVisible({ timeout: 120_000 });
  await expect(mainsTiles(page)).toHaveCount(0);
  await page.getByTestId('screen-start').click();
  await expect(page.getByTestId('recording-mains')).toHaveText('mains 50 Hz (given)');
  await page.getByTestId('mains-override').selectOption('file');
  await expect(page.getByTestId('board')).toBeVisible({ timeout: 120_000 });
  await expect(mainsTiles(page)).toHaveCount(atSixty);

  // Lock column: time-locking is then also tested for each value of events.tsv "condition" (before: event types only).
  await page.getByTestId('tile-1').dblclick();
  await page.getByTestId('focus-question-locked').click();
  await expect(page.getByText('Time-locking (tone)').first()).toBeAttached();
  await expect(page.getByText('Time-locking (tone, condition rare)')).toHaveCount(0);
  await page.getByTestId('screen-start').click();
  await page.getByTestId('lock-column-select').selectOption('condition');
  await expect(page.getByTestId('board')).toBeVisible({ timeout: 120_000 });
  await page.getByTestId('tile-1').dblclick();
  await page.getByTestId('focus-question-locked').click();
  await expect(page.getByText('Time-locking (tone, condition rare)').first()).toBeAttached();
  await expect(page.getByText('Time-locking (tone, condition standard)').first()).toBeAttached();
});
