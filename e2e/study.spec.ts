/**
 * Issue 11, the study in the browser: open the simulated demo study, review two participants, see a flag
 * and follow it, export the study (a zip of BIDS derivatives, read back by Python's zipfile), import a
 * second reviewer's export, see Cohen's kappa and walk the disagreements. Then a dataset on disk with a
 * batch run's outputs (`winnow simulate-study` + `winnow batch`): the batch evidence is loaded, not computed,
 * and a file made for another decomposition is ignored with a notice.
 */
import { expect, test, type Page } from '@playwright/test';
import { spawnSync } from 'node:child_process';
import { cp, mkdir, mkdtemp, readFile, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const LOAD_TIMEOUT = 90_000;

async function reviewParticipant(page: Page, row: number, decide: (page: Page) => Promise<void>) {
  await page.getByTestId('study-open').nth(row).click();
  await expect(page.getByTestId('board')).toBeVisible({ timeout: LOAD_TIMEOUT });
  const resume = page.getByTestId('resume-accept');
  if (await resume.isVisible().catch(() => false)) await resume.click();
  await decide(page);
  await page.getByTestId('back-to-study').click();
  await expect(page.getByTestId('study-view')).toBeVisible();
}

async function mark(page: Page, index: number, verdict: 'keep' | 'remove', reason: string) {
  await page.getByTestId(`tile-${index}`).click();
  await page.getByTestId(`verdict-${verdict}`).click();
  await page.getByTestId('reason-select').selectOption(reason);
  await expect(page.getByTestId(`tile-${index}`)).toHaveAttribute('data-verdict', verdict);
}

test('a study: two participants reviewed, a flag followed, the study exported, a second reviewer compared', async ({ page }) => {
  test.setTimeout(420_000);
  await page.goto('/');
  await page.getByTestId('open-demo-study').click();
  await expect(page.getByTestId('study-view')).toBeVisible({ timeout: 60_000 });
  await expect(page.getByTestId('study-row')).toHaveCount(4);
  await expect(page.locator('[data-testid="study-row"][data-state="not started"]')).toHaveCount(4);
  // headers are read lazily, one recording at a time: 32 EEG channels, 1.5 minutes each
  await expect(page.getByTestId('study-length').nth(3)).toHaveText(/^32\s?ch · 1\.5\s?min$/);

  // participant 1: two decisions; participant 2: one
  await reviewParticipant(page, 0, async (p) => {
    await mark(p, 1, 'remove', 'blink');
    await mark(p, 2, 'keep', 'neural');
  });
  await expect(page.locator('[data-testid="study-row"][data-state="in progress"]')).toHaveCount(1);
  await reviewParticipant(page, 1, async (p) => {
    await mark(p, 1, 'remove', 'blink');
  });
  await expect(page.locator('[data-testid="study-row"][data-state="in progress"]')).toHaveCount(2);

  // a flag says why, and opens that participant
  const flag = page.locator('[data-testid="study-flag"][data-rule="undecided"]').first();
  await expect(flag).toContainText('left undecided');
  await flag.getByTestId('study-flag-open').click();
  await expect(page.getByTestId('board')).toBeVisible({ timeout: LOAD_TIMEOUT });
  const resume = page.getByTestId('resume-accept');
  if (await resume.isVisible().catch(() => false)) await resume.click();
  await expect(page.getByTestId('tile-1')).toHaveAttribute('data-verdict', 'remove');
  await page.getByTestId('back-to-study').click();

  // export the study: a zip of BIDS derivatives
  const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId('study-export').click()]);
  const dir = await mkdtemp(join(tmpdir(), 'winnow-study-e2e-'));
  const zipPath = join(dir, 'study.zip');
  await download.saveAs(zipPath);
  const py = 'import zipfile,sys,json; z=zipfile.ZipFile(sys.argv[1]); assert z.testzip() is None; print(json.dumps({n: z.read(n).decode() for n in z.namelist()}))';
  const r = spawnSync('python3', ['-c', py, zipPath], { encoding: 'utf8' });
  expect(r.status, r.stderr).toBe(0);
  const entries = JSON.parse(r.stdout) as Record<string, string>;
  const names = Object.keys(entries).sort();
  expect(names).toContain('derivatives/winnow/dataset_description.json');
  expect(names).toContain('derivatives/winnow/sub-01/eeg/sub-01_task-walkoddball_desc-winnow_decisions.json');
  expect(names).toContain('derivatives/winnow/sub-01/eeg/sub-01_task-walkoddball_desc-winnow_decisions.tsv');
  expect(names).toContain('derivatives/winnow/sub-02/eeg/sub-02_task-walkoddball_desc-winnow_decisions.json');
  expect(JSON.parse(entries['derivatives/winnow/dataset_description.json']).GeneratedBy[0].Name).toBe('winnow');

  // a second reviewer: same files, with component 2 of sub-01 removed (gaze) instead of kept
  const secondDir = join(dir, 'second', 'sub-01', 'eeg');
  await mkdir(secondDir, { recursive: true });
  const d1 = JSON.parse(entries['derivatives/winnow/sub-01/eeg/sub-01_task-walkoddball_desc-winnow_decisions.json']);
  d1.reviewer = 'second';
  d1.components = d1.components.map((c: { index: number }) => (c.index === 2 ? { ...c, verdict: 'remove', reason: 'gaze', note: 'step-like' } : c));
  const f1 = join(secondDir, 'sub-01_task-walkoddball_desc-winnow_decisions.json');
  await writeFile(f1, JSON.stringify(d1));
  const f2 = join(dir, 'second', 'sub-02_task-walkoddball_desc-winnow_decisions.json');
  await writeFile(f2, entries['derivatives/winnow/sub-02/eeg/sub-02_task-walkoddball_desc-winnow_decisions.json']);
  await page.getByTestId('second-import').setInputFiles([f1, f2]);
  await expect(page.getByTestId('agreement-table')).toBeVisible();
  await expect(page.getByTestId('kappa-pooled')).toHaveText(/^-?\d\.\d{3} \(|undefined|nothing/);

  // walk the one disagreement and adjudicate
  const walk = page.getByTestId('disagreement-walk');
  await expect(walk).toContainText('component 2');
  await expect(page.getByTestId('walk-mine')).toContainText('keep');
  await expect(page.getByTestId('walk-other')).toContainText('remove, gaze');
  await page.getByTestId('walk-take-other').click();
  await expect(page.getByTestId('walk-adjudicated')).toContainText('remove, gaze');

  // the adjudicated file keeps both raters' entries
  const [again] = await Promise.all([page.waitForEvent('download'), page.getByTestId('study-export').click()]);
  const zip2 = join(dir, 'study2.zip');
  await again.saveAs(zip2);
  const r2 = spawnSync('python3', ['-c', py, zip2], { encoding: 'utf8' });
  const entries2 = JSON.parse(r2.stdout) as Record<string, string>;
  const adj = JSON.parse(entries2['derivatives/winnow/sub-01/eeg/sub-01_task-walkoddball_desc-adjudicated_decisions.json']);
  const c2 = adj.components.find((c: { index: number }) => c.index === 2);
  expect(c2.verdict).toBe('remove');
  expect(c2.raters.map((x: { verdict: string }) => x.verdict)).toEqual(['keep', 'remove']);
  expect(adj.adjudication.raters[1].reviewer).toBe('second');
});

test('a batch run’s evidence is reused when its hashes match, and ignored with a notice when they do not', async ({ page }) => {
  test.setTimeout(240_000);
  const dir = await mkdtemp(join(tmpdir(), 'winnow-study-batch-e2e-'));
  const ds = join(dir, 'ds');
  const cli = (...args: string[]) => {
    const r = spawnSync(process.execPath, [join(process.cwd(), 'bin', 'winnow.mjs'), ...args], { encoding: 'utf8' });
    expect(r.status, r.stderr).toBe(0);
  };
  cli('simulate-study', '--out', ds, '--participants', '1', '--minutes', '1');
  cli('batch', ds, join(ds, 'derivatives', 'winnow'), 'participant');
  const evidenceRel = 'derivatives/winnow/sub-01/eeg/sub-01_task-walkoddball_desc-winnow_evidence.json';
  // the same dataset with the evidence file claiming another decomposition
  const bad = join(dir, 'bad');
  await cp(ds, bad, { recursive: true });
  const ev = JSON.parse(await readFile(join(bad, evidenceRel), 'utf8'));
  ev.decompositionSha256 = '0'.repeat(64);
  await writeFile(join(bad, evidenceRel), JSON.stringify(ev));

  await page.goto('/');
  await page.getByTestId('study-folder').setInputFiles(ds);
  await expect(page.getByTestId('study-row')).toHaveCount(1, { timeout: 60_000 });
  await page.getByTestId('study-open').first().click();
  await expect(page.getByTestId('board')).toBeVisible({ timeout: LOAD_TIMEOUT });
  await expect(page.locator('[data-testid^="tile-"]')).toHaveCount(ev.components.length);
  await page.getByTestId('screen-start').click();
  const origin = page.getByTestId('recording-evidence-origin');
  await expect(origin).toHaveAttribute('data-origin', 'batch');
  await expect(origin).toContainText(/evidence from batch run, \d{4}-\d\d-\d\d \d\d:\d\d UTC/);
  await expect(origin).toContainText(evidenceRel);
  // compute evidence again: computed here, and the summary no longer names the batch run
  await page.getByTestId('recompute-evidence-batch').click();
  await expect(page.getByTestId('board')).toBeVisible({ timeout: LOAD_TIMEOUT });
  await page.getByTestId('screen-start').click();
  await expect(page.getByTestId('recording-summary')).toBeVisible();
  await expect(origin).toHaveCount(0);

  // a file made for another decomposition: ignored, named, and the evidence computed here
  await page.goto('/');
  await page.getByTestId('study-folder').setInputFiles(bad);
  await expect(page.getByTestId('study-row')).toHaveCount(1, { timeout: 60_000 });
  await page.getByTestId('study-open').first().click();
  await expect(page.getByTestId('board')).toBeVisible({ timeout: LOAD_TIMEOUT });
  await page.getByTestId('screen-start').click();
  await expect(origin).toHaveAttribute('data-origin', 'ignored');
  await expect(origin).toContainText(`${evidenceRel} was not used (made for another decomposition`);
});
