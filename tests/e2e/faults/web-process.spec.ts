import { readdirSync, readFileSync } from 'node:fs';
import { expect, test } from '@playwright/test';
import { signedInContext } from '../support';

// scripts/serve.mjs runs two web processes on the test port (playwright.config.ts). One of them is
// killed outright; serve.mjs starts another, and the other serves signed-in pages while it starts up.
// (A connection handed to a process in the very moment it dies is lost with it: Node's cluster module
// stops handing out to a process only once it has seen the process go.)
const port = Number(process.env.GATEWELL_E2E_PORT ?? 4311);

function processes(): { pid: number; parent: number; command: string }[] {
  return readdirSync('/proc')
    .filter((name) => /^\d+$/.test(name))
    .flatMap((name) => {
      try {
        const command = readFileSync(`/proc/${name}/cmdline`, 'utf8').split('\0').join(' ');
        const parent = Number(readFileSync(`/proc/${name}/stat`, 'utf8').split(') ')[1]!.split(' ')[1]);
        return [{ pid: Number(name), parent, command }];
      } catch {
        return [];
      }
    });
}

/** The web processes below the serve.mjs primary on the test port (the shell that started it is not a node process). */
function webProcesses(): number[] {
  const serving = processes().filter(
    (p) =>
      /(^|\/)node /.test(p.command) &&
      p.command.includes('scripts/serve.mjs') &&
      p.command.includes(`--port ${port}`),
  );
  const primary = serving.find((p) => !serving.some((q) => q.pid === p.parent));
  return primary ? serving.filter((p) => p.parent === primary.pid).map((p) => p.pid) : [];
}

test('a web process that dies is replaced while the other serves', async ({ browser }) => {
  test.skip(process.platform !== 'linux', 'reads /proc');
  test.skip(Boolean(process.env.GATEWELL_E2E_REUSE), 'needs the server this run started');
  const before = webProcesses();
  expect(before).toHaveLength(2);
  const { page } = await signedInContext(browser, 'chemist');

  process.kill(before[0]!, 'SIGKILL');
  // serve.mjs forks the replacement once it has seen the death (and stopped handing connections to that
  // process); while the replacement starts up, the other process serves every request on its own.
  await expect
    .poll(() => webProcesses().filter((pid) => !before.includes(pid)).length, { timeout: 30_000 })
    .toBe(1);
  for (let i = 0; i < 10; i++) {
    // A fresh connection each time, so that each is handed out anew.
    const answer = await page.request.get('/plates', { headers: { connection: 'close' } });
    expect(answer.status()).toBe(200);
  }
  expect(webProcesses()).toHaveLength(2);
  await expect
    .poll(async () => (await page.request.get('/api/health')).status(), { timeout: 60_000 })
    .toBe(200);
  await page.goto('/plates');
  await expect(page.getByRole('heading', { name: 'Plates', level: 1 })).toBeVisible();
});
