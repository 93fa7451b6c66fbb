import Link from 'next/link';
import type { ReactNode } from 'react';
import { HeaderMenu } from './header-menu';

export const AREAS = [
  { href: '/rigs', label: 'Rigs' },
  { href: '/trials', label: 'Trials' },
  { href: '/fits', label: 'Fits' },
  { href: '/comparisons', label: 'Compare' },
  { href: '/forecasts', label: 'Forecasts' },
  { href: '/studies', label: 'Studies' },
] as const;

export function Brand() {
  return (
    <Link href="/" className="flex items-center gap-2 text-white no-underline hover:no-underline" aria-label="Emberline home">
      <svg aria-hidden="true" viewBox="0 0 32 32" className="h-8 w-8">
        <rect width="32" height="32" rx="7" fill="#342B26" />
        <path d="M16 5c1.8 4.2 6.5 6.6 6.5 12.2A6.5 6.5 0 0 1 9.5 17.2c0-2.6 1.2-4.3 2.7-5.8.3 2 1.3 3.2 2.6 3.6-.5-3.5.1-6.9 1.2-10z" fill="#F07F35" />
        <path d="M9 24.5c2.3 1.4 4.7 1.4 7 0s4.7-1.4 7 0" stroke="#2C9AA0" strokeWidth="2" fill="none" strokeLinecap="round" />
      </svg>
      <span className="text-lg font-semibold tracking-tight">Emberline</span>
    </Link>
  );
}

/**
 * The top bar: brand, the work areas, whatever the caller puts on the right (sign-in), and the
 * account and lab controls (`menu`), which fold behind a Menu button on a phone (HeaderMenu).
 */
export function SiteHeader({ right, menu }: { right?: ReactNode; menu?: ReactNode }) {
  return (
    <header className="relative bg-coal text-white">
      <div className="mx-auto flex max-w-page flex-wrap items-center gap-x-6 gap-y-2 px-4 py-3">
        <Brand />
        <nav aria-label="Work areas" className="order-3 -mx-1 flex w-full gap-1 overflow-x-auto sm:order-none sm:w-auto">
          {AREAS.map((a) => (
            <Link
              key={a.href}
              href={a.href}
              className="shrink-0 rounded-md px-3 py-1.5 text-sm font-medium text-paper-deep no-underline hover:bg-coal-raised hover:text-white hover:no-underline"
            >
              {a.label}
            </Link>
          ))}
        </nav>
        <div className="ml-auto flex min-w-0 items-center gap-3 text-sm">
          {right}
          {menu ? <HeaderMenu>{menu}</HeaderMenu> : null}
        </div>
      </div>
    </header>
  );
}
