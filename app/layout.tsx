import type { Metadata, Viewport } from 'next';
import type { ReactNode } from 'react';
// Fonts are bundled from @fontsource (latin subsets): nothing is fetched at build or run time.
import '@fontsource/inter/latin-400.css';
import '@fontsource/inter/latin-500.css';
import '@fontsource/inter/latin-600.css';
import '@fontsource/inter/latin-700.css';
import '@fontsource/jetbrains-mono/latin-400.css';
import '@fontsource/jetbrains-mono/latin-500.css';
import './globals.css';
import { SafetyNotice } from './_components/safety-notice';

export const metadata: Metadata = {
  title: { default: 'Emberline', template: '%s · Emberline' },
  description: 'A workbench for testing water heaters: import trials, fit physical models, forecast pool warm-up.',
  // public/: icon.svg is the one drawing; the PNGs and favicon.ico are made from it by `npm run icons`
  icons: {
    icon: [
      { url: '/favicon.ico', sizes: '16x16 32x32 48x48' },
      { url: '/icon.svg', type: 'image/svg+xml' },
    ],
    apple: [{ url: '/apple-touch-icon.png', sizes: '180x180', type: 'image/png' }],
  },
  manifest: '/manifest.webmanifest',
};

// Every page is rendered per request: its scripts carry the nonce of that request's
// Content-Security-Policy (proxy.ts), which a page prerendered at build time could not have.
export const dynamic = 'force-dynamic';

export const viewport: Viewport = { width: 'device-width', initialScale: 1, themeColor: '#241E1B' };

export default function RootLayout({ children }: { children: ReactNode }) {
  return (
    <html lang="en">
      <body className="flex min-h-screen flex-col">
        <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-50 focus:rounded focus:bg-white focus:px-3 focus:py-2">
          Skip to content
        </a>
        <div className="flex-1">{children}</div>
        <SafetyNotice />
        <footer className="bg-coal text-paper-deep">
          <div className="mx-auto flex max-w-page flex-wrap justify-between gap-2 px-4 py-4 text-xs">
            <span>Emberline · numbers stored in SI, shown in your units</span>
            <span>
              <a className="text-ember-200" href="/help/permissions">Roles and permissions</a>
            </span>
          </div>
        </footer>
      </body>
    </html>
  );
}
