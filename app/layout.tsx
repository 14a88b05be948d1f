import type { Metadata, Viewport } from 'next';
import { connection } from 'next/server';
import '@fontsource/karla/400.css';
import '@fontsource/karla/600.css';
import '@fontsource/karla/700.css';
import './globals.css';
import { ZodJitless } from '@/components/shell/zod-jitless-boot';

export const metadata: Metadata = {
  title: { default: 'Ohmstead', template: '%s · Ohmstead' },
  description: 'Stock, loans, electrical checks and money for a makerspace electronics bench.',
};

export const viewport: Viewport = { width: 'device-width', initialScale: 1 };

// Every page renders per request: its scripts carry that request's CSP nonce (proxy.ts).
export default async function RootLayout({ children }: { children: React.ReactNode }) {
  await connection();
  return (
    <html lang="en">
      <body className="min-h-screen font-sans">
        <ZodJitless />
        {children}
      </body>
    </html>
  );
}
