/**
 * Issue 10 item 5: the preview says what the decomposition missed. On the demo participant nothing removed
 * leaves the blinks and the mains on the cleaned channels; removing the blink component (1) clears the eye
 * warning, removing the mains component (16) as well clears the notice (src/core/review/residual.ts).
 */
import { expect, test } from '@playwright/test';

test('the preview warns about artefact left on the cleaned channels, and stops when it is removed', async ({ page }) => {
  test.setTimeout(150_000);
  await page.goto('/?demo=1');
  await expect(page.getByTestId('board')).toBeVisible({ timeout: 90_000 });

  await page.getByTestId('screen-preview').click();
  const notice = page.getByTestId('residual-notice');
  await expect(notice).toContainText('eye artefact remains', { timeout: 30_000 });
  await expect(notice).toContainText('mains interference remains');
  await expect(notice).toContainText('50 Hz');

  for (const [index, gone] of [[1, 'eye artefact remains'], [16, 'mains interference remains']] as const) {
    await page.getByTestId('screen-board').click();
    await page.getByTestId(`tile-${index}`).click();
    await page.getByTestId('verdict-remove').click();
    await expect(page.getByTestId(`tile-${index}`)).toHaveAttribute('data-verdict', 'remove');
    await page.getByTestId('screen-preview').click();
    await expect(notice).not.toContainText(gone, { timeout: 30_000 });
    await expect(notice).not.toContainText('Checking', { timeout: 30_000 });
  }
  await expect(notice).toContainText('No eye, mains or heartbeat artefact found');
});
