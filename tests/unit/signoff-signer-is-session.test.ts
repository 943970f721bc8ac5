import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, test } from 'vitest';

// A signature is always the signed-in person's own: no route handler or server action of the app names
// a signer. The sign-off service takes the acting user only, and the one action that calls it passes
// the actor validatedAction gives it (the session's user); tests/integration/signoff-duties-rounds.test.ts
// shows that a request naming another signer still signs as the actor.

describe('the signer is the session’s user', () => {
  test('every caller of the sign-off service in the app passes the session’s actor, never a named signer', () => {
    const files: string[] = [];
    const walk = (dir: string) => {
      for (const name of readdirSync(dir)) {
        const path = join(dir, name);
        if (statSync(path).isDirectory()) walk(path);
        else if (/\.(ts|tsx)$/.test(name)) files.push(path);
      }
    };
    walk('app');
    const callers = files.filter((f) => /\b(signPlateStep|signRecord)\(/.test(readFileSync(f, 'utf8')));
    expect(callers).toEqual([join('app', '(app)', 'plates', '[plateId]', 'signoff', 'actions.ts')]);
    const source = readFileSync(callers[0]!, 'utf8');
    // The action is wrapped by validatedAction, which hands it the signed-in actor, and passes that actor on.
    expect(source).toMatch(/validatedAction\(\s*signoffRequestSchema[\s\S]*async \(input, actor\) =>/);
    expect([...source.matchAll(/signPlateStep\(([^,]+),/g)].map((m) => m[1]!.trim())).toEqual(['actor']);
    expect(source).not.toMatch(/signRecord/);

    // In lib/, the signature itself is written only by the sign-off service, for the actor it was given.
    files.length = 0;
    walk('lib');
    const signers = files.filter((f) => /\bsignRecord\(/.test(readFileSync(f, 'utf8')));
    expect(signers.sort()).toEqual([
      join('lib', 'auth', 'signature.ts'),
      join('lib', 'signoff', 'service.ts'),
    ]);
    const service = readFileSync(join('lib', 'signoff', 'service.ts'), 'utf8');
    expect([...service.matchAll(/signRecord\(\s*([^,]+),/g)].map((m) => m[1]!.trim())).toEqual(['actor']);
    expect(service).toMatch(/export async function signPlateStep\(\s*actor: Actor,/);
  });
});
