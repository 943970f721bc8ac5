import type { Metadata, Viewport } from 'next';
import { headers } from 'next/headers';
import type { ReactNode } from 'react';
import { StyleNonceProvider } from '@/components/ui/csp-context';
import { NONCE_HEADER } from '@/lib/security/content-security-policy';
import { plexMono, plexSans } from './fonts';
import './globals.css';

export const metadata: Metadata = {
  title: { default: 'Gatewell', template: '%s · Gatewell' },
  description:
    'Ion-channel plate screening: quality control, Hill fits, excitability forecasts and sign-off.',
};

export const viewport: Viewport = { width: 'device-width', initialScale: 1 };

// Reading the request's nonce renders every page per request, which a nonce-based CSP needs anyway.
export default async function RootLayout({ children }: { children: ReactNode }) {
  const nonce = (await headers()).get(NONCE_HEADER) ?? undefined;
  return (
    <html lang="en" className={`${plexSans.variable} ${plexMono.variable}`}>
      <body className="min-h-screen">
        <StyleNonceProvider nonce={nonce}>{children}</StyleNonceProvider>
      </body>
    </html>
  );
}
