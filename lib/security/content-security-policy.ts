// No 'server-only' here: the proxy builds the policy, and the root layout reads the nonce header named below.

/** Request header that carries this request's nonce from the proxy to the root layout (never trusted from the client). */
export const NONCE_HEADER = 'x-gatewell-nonce';

/** A fresh, unguessable nonce for one request: 16 random bytes in base64. */
export function newNonce(): string {
  const bytes = crypto.getRandomValues(new Uint8Array(16));
  return btoa(String.fromCharCode(...bytes));
}

/**
 * Gatewell's Content-Security-Policy for one answer.
 *
 * Scripts run only with this request's nonce (Next puts it on its own scripts when it finds the policy on
 * the request) and whatever those load ('strict-dynamic'). Style elements need the nonce too: ag-grid's
 * theme injects its style tags with it (`styleNonce`, components/ui/data-grid.tsx). Style attributes are
 * allowed inline (`style-src-attr 'unsafe-inline'`): React renders `style={…}` as attributes in the server
 * HTML (grid heights, legend swatches) and ag-grid positions rows and columns with them. An attribute sets
 * properties of one element; it cannot run script or carry the selectors that style-based data theft
 * needs, and those stay shut because style elements are still nonce-only.
 */
export function contentSecurityPolicy(nonce: string): string {
  return [
    "default-src 'self'",
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'`,
    `style-src 'self' 'nonce-${nonce}'`,
    `style-src-elem 'self' 'nonce-${nonce}'`,
    "style-src-attr 'unsafe-inline'",
    "img-src 'self' data: blob:",
    "font-src 'self'",
    "connect-src 'self'",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
  ].join('; ');
}
