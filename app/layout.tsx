import type { Metadata, Viewport } from 'next';
import type { ReactNode } from 'react';
import { displayFont, textFont } from './fonts';
import { Providers } from './providers';
import './globals.css';

export const metadata: Metadata = {
  title: { default: 'Demold', template: '%s · Demold' },
  description: 'Hand-sculpted, cast and painted masks from small studios, sold in limited drops.',
};

export const viewport: Viewport = {
  themeColor: '#f7f3ec',
  width: 'device-width',
  initialScale: 1,
};

export default function RootLayout({ children }: { children: ReactNode }) {
  return (
    <html lang="en" className={`${displayFont.variable} ${textFont.variable}`}>
      <body>
        <Providers>{children}</Providers>
      </body>
    </html>
  );
}
