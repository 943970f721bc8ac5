import type { Metadata, Viewport } from 'next';
import type { ReactNode } from 'react';
import { plexMono, plexSans } from './fonts';
import './globals.css';

export const metadata: Metadata = {
  title: { default: 'Gatewell', template: '%s · Gatewell' },
  description: 'Ion-channel plate screening: quality control, Hill fits, excitability forecasts and sign-off.',
};

export const viewport: Viewport = { width: 'device-width', initialScale: 1 };

export default function RootLayout({ children }: { children: ReactNode }) {
  return (
    <html lang="en" className={`${plexSans.variable} ${plexMono.variable}`}>
      <body className="min-h-screen">{children}</body>
    </html>
  );
}
