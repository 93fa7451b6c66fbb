'use client';

import { usePathname } from 'next/navigation';
import { useEffect, useId, useRef, useState, type ReactNode } from 'react';

/**
 * The account and lab controls of the header. From the `md` breakpoint up they sit in the bar as
 * they are; on a narrower screen they fold behind a "Menu" button (the WAI-ARIA APG disclosure
 * pattern: a button with `aria-expanded` and `aria-controls`), which opens them as a panel under
 * the bar. Escape closes the panel and returns focus to the button; so do a click outside it and
 * moving to another page. Without JavaScript the panel stays closed on a phone, and the same
 * pages are reachable from the account page and the lab bar.
 */
export function HeaderMenu({ children }: { children: ReactNode }) {
  const [open, setOpen] = useState(false);
  const id = useId();
  const button = useRef<HTMLButtonElement>(null);
  const box = useRef<HTMLDivElement>(null);
  const pathname = usePathname();
  const [shownFor, setShownFor] = useState(pathname);
  if (shownFor !== pathname) {
    // a new page: the panel closes (state adjusted while rendering, as React recommends)
    setShownFor(pathname);
    setOpen(false);
  }

  useEffect(() => {
    if (!open) return;
    const onKey = (e: KeyboardEvent) => {
      if (e.key !== 'Escape') return;
      setOpen(false);
      button.current?.focus();
    };
    const onPointer = (e: PointerEvent) => {
      if (!box.current?.contains(e.target as Node)) setOpen(false);
    };
    document.addEventListener('keydown', onKey);
    document.addEventListener('pointerdown', onPointer);
    return () => {
      document.removeEventListener('keydown', onKey);
      document.removeEventListener('pointerdown', onPointer);
    };
  }, [open]);

  return (
    <div ref={box} className="flex items-center">
      <button
        ref={button}
        type="button"
        className="flex items-center gap-2 rounded-md px-2 py-1.5 text-sm text-paper-deep hover:bg-coal-raised hover:text-white md:hidden"
        aria-expanded={open}
        aria-controls={id}
        onClick={() => setOpen((o) => !o)}
      >
        <svg aria-hidden="true" viewBox="0 0 20 20" className="h-5 w-5" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round">
          {open ? <path d="M5 5l10 10M15 5L5 15" /> : <path d="M3 6h14M3 10h14M3 14h14" />}
        </svg>
        Menu
      </button>
      <div
        id={id}
        className={`${open ? 'flex' : 'hidden'} absolute inset-x-0 top-full z-40 flex-col items-stretch gap-1 border-t border-coal-line bg-coal px-4 py-3 shadow-lg md:static md:flex md:flex-row md:items-center md:gap-3 md:border-0 md:bg-transparent md:p-0 md:shadow-none`}
      >
        {children}
      </div>
    </div>
  );
}
