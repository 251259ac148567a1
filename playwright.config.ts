import { defineConfig } from '@playwright/test';
import { execFileSync } from 'node:child_process';

/**
 * A free port for the preview server, so several test runs on one machine never collide. Found once, by the
 * config's first evaluation (in the runner), and handed to the workers through the environment: they
 * evaluate this file again and must see the same port.
 */
function freePort(): number {
  const script = "const s=require('node:net').createServer();s.listen(0,'127.0.0.1',()=>{process.stdout.write(String(s.address().port));s.close();});";
  return Number(execFileSync(process.execPath, ['-e', script], { encoding: 'utf8' }).trim());
}
process.env.WINNOW_E2E_PORT ??= String(freePort());
const port = Number(process.env.WINNOW_E2E_PORT);
/** The page's origin, for specs that check no request leaves it. */
process.env.WINNOW_E2E_ORIGIN = `http://127.0.0.1:${port}`;

/** Playwright drives Debian's Chromium; it never downloads a browser of its own. */
const executablePath = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

export default defineConfig({
  testDir: 'e2e',
  outputDir: 'test-results/e2e',
  timeout: 90_000,
  expect: { timeout: 20_000 },
  workers: 1,
  reporter: [['list']],
  use: {
    baseURL: process.env.WINNOW_E2E_ORIGIN,
    headless: true,
    launchOptions: {
      executablePath,
      args: [
        '--no-sandbox',
        '--disable-gpu',
        '--disable-background-networking',
        '--disable-component-update',
        '--disable-sync',
        '--no-first-run',
        '--disable-quic',
      ],
    },
  },
  webServer: {
    command: `npx vite preview --host 127.0.0.1 --port ${port} --strictPort --bypass-lock`,
    url: process.env.WINNOW_E2E_ORIGIN,
    reuseExistingServer: !process.env.CI,
    timeout: 60_000,
  },
});
