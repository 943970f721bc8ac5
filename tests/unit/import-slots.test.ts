import { afterEach, describe, expect, test } from 'vitest';
import { IMPORT_QUEUE_LIMIT, withImportSlot } from '@/lib/imports/import-slots';

// Each web process reads at most GATEWELL_IMPORT_SLOTS uploads at once and queues the rest in arrival
// order (lib/imports/import-slots.ts). The work here is a promise the test settles by hand.
function gate() {
  let open!: () => void;
  const opened = new Promise<void>((resolve) => (open = resolve));
  return { open, opened };
}

const tick = () => new Promise((resolve) => setImmediate(resolve));

describe('import slots', () => {
  afterEach(() => {
    delete process.env.GATEWELL_IMPORT_SLOTS;
  });

  test('one upload at a time by default, the next in arrival order, and a failure frees the slot', async () => {
    const started: string[] = [];
    const gates = { a: gate(), b: gate(), c: gate() };
    const run = (name: keyof typeof gates, fail = false) =>
      withImportSlot(async () => {
        started.push(name);
        await gates[name].opened;
        if (fail) throw new Error(`${name} failed`);
        return name;
      });
    const a = run('a', true);
    const b = run('b');
    const c = run('c');
    await tick();
    expect(started).toEqual(['a']);
    gates.a.open();
    await expect(a).rejects.toThrow('a failed');
    await tick();
    expect(started).toEqual(['a', 'b']);
    gates.b.open();
    gates.c.open();
    expect(await Promise.all([b, c])).toEqual(['b', 'c']);
    expect(started).toEqual(['a', 'b', 'c']);
  });

  test('GATEWELL_IMPORT_SLOTS lets that many run at once', async () => {
    process.env.GATEWELL_IMPORT_SLOTS = '2';
    const running: number[] = [];
    let now = 0;
    const hold = gate();
    const work = () =>
      withImportSlot(async () => {
        running.push(++now);
        await hold.opened;
        now -= 1;
      });
    const all = [work(), work(), work()];
    await tick();
    expect(running).toEqual([1, 2]);
    hold.open();
    await Promise.all(all);
    expect(Math.max(...running)).toBe(2);
  });

  test('an upload that would wait behind too many others is refused with a 503 and runs nothing', async () => {
    const hold = gate();
    const queued = Array.from({ length: IMPORT_QUEUE_LIMIT + 1 }, () => withImportSlot(() => hold.opened));
    let ran = false;
    await expect(
      withImportSlot(async () => {
        ran = true;
      }),
    ).rejects.toMatchObject({
      code: 'unavailable',
      status: 503,
      message: expect.stringMatching(/nothing was changed/),
    });
    expect(ran).toBe(false);
    hold.open();
    await Promise.all(queued);
  });
});
