'use client';

import { createContext, useContext, useState, type ReactNode } from 'react';
import { z } from 'zod';

// What client code needs to live under Gatewell's CSP (lib/security/content-security-policy.ts), loaded on every page by the root layout.

// zod probes for eval with `new Function` once; under a CSP without 'unsafe-eval' the browser reports the probe as a
// violation even though zod catches it. Browsers parse without the compiled fast path; the server keeps it.
if (typeof window !== 'undefined') z.config({ jitless: true });

const StyleNonceContext = createContext<string | undefined>(undefined);

/**
 * Hands the document's CSP nonce (from the proxy, read by the root layout) to client code that injects
 * style tags. A browser holds a document to the policy of the answer that loaded it, while an RSC payload
 * that renders the root layout again (the redirect after signing in, a refresh after a server action)
 * brings the nonce of its own request: the provider keeps the nonce it was first rendered with.
 */
export function StyleNonceProvider({ nonce, children }: { nonce: string | undefined; children: ReactNode }) {
  const [documentNonce] = useState(nonce);
  return <StyleNonceContext.Provider value={documentNonce}>{children}</StyleNonceContext.Provider>;
}

/** The nonce that style tags injected on this page must carry, or undefined outside a proxied request. */
export function useStyleNonce(): string | undefined {
  return useContext(StyleNonceContext);
}
