import { describe, expect, test } from 'vitest';
import { contentSecurityPolicy, newNonce } from '@/lib/security/content-security-policy';

describe('Gatewell content security policy', () => {
  test('nonces are 16 random bytes in base64 and differ between requests', () => {
    const nonces = new Set(Array.from({ length: 200 }, newNonce));
    expect(nonces.size).toBe(200);
    for (const nonce of nonces) expect(Buffer.from(nonce, 'base64')).toHaveLength(16);
  });

  test('scripts and style tags need the nonce; nothing is framed, posted or based elsewhere', () => {
    const directives = Object.fromEntries(
      contentSecurityPolicy('abc123==')
        .split('; ')
        .map((d) => [d.split(' ')[0], d.slice(d.indexOf(' ') + 1)]),
    );
    expect(directives).toEqual({
      'default-src': "'self'",
      'script-src': "'self' 'nonce-abc123==' 'strict-dynamic'",
      'style-src': "'self' 'nonce-abc123=='",
      'style-src-elem': "'self' 'nonce-abc123=='",
      'style-src-attr': "'unsafe-inline'",
      'img-src': "'self' data: blob:",
      'font-src': "'self'",
      'connect-src': "'self'",
      'object-src': "'none'",
      'base-uri': "'self'",
      'form-action': "'self'",
      'frame-ancestors': "'none'",
    });
  });
});
