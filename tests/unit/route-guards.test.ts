import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { NextRequest } from 'next/server';
import { describe, expect, test } from 'vitest';
import { NAV_ITEMS } from '@/components/shell/nav-items';
import { withUser } from '@/lib/api/handler';
import { rolesForPath } from '@/lib/auth/page-roles';
import { rolesFor } from '@/lib/domain/roles';

function routeFiles(dir = 'app'): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) return routeFiles(full);
    return entry.name === 'route.ts' ? [full] : [];
  });
}

describe('route handlers that change data', () => {
  const changing = routeFiles().flatMap((file) =>
    [
      ...readFileSync(file, 'utf8').matchAll(
        /export\s+(const|async\s+function|function)\s+(POST|PUT|PATCH|DELETE)\b(.*)/g,
      ),
    ].map((match) => ({ file, kind: match[1]!, method: match[2]!, rest: match[3]! })),
  );

  test.each(changing.map((c) => [`${c.method} ${c.file}`, c]))(
    '%s goes through withUser (Origin check, actor, roles)',
    (_label, c) => {
      expect(c.kind).toBe('const');
      expect(c.rest).toMatch(/^\s*=\s*withUser(<[^(]*>)?\(/);
    },
  );

  test.each([
    ['no Origin header', undefined],
    ['a foreign Origin', 'https://elsewhere.example'],
  ])('withUser refuses a changing request with %s before it looks for a session', async (_label, origin) => {
    let ran = false;
    const handler = withUser(async () => {
      ran = true;
      return new Response('changed');
    });
    const request = new NextRequest('http://127.0.0.1:4310/api/anything', {
      method: 'POST',
      headers: origin ? { origin } : {},
    });
    const response = await handler(request, { params: Promise.resolve({}) });
    expect(response.status).toBe(403);
    expect(await response.json()).toMatchObject({ error: 'forbidden' });
    expect(ran).toBe(false);
  });
});

describe('pages that need a role', () => {
  test.each([
    ['/admin/users', ['admin']],
    ['/admin/users/new', ['admin']],
    ['/audit', ['admin', 'approver']],
    ['/auditor', null],
    ['/plates', null],
    ['/', null],
  ])('%s needs %o', (pathname, roles) => {
    expect(rolesForPath(pathname)).toEqual(roles);
  });

  test('a navigation entry is shown to exactly the roles its page lets in', () => {
    for (const item of NAV_ITEMS) {
      const roles = item.capability === null ? [] : rolesFor(item.capability);
      expect([...roles].sort(), item.href).toEqual([...(rolesForPath(item.href) ?? [])].sort());
    }
  });
});
