"use client";

import { useState, type ReactNode } from "react";

// On a phone the site header is one line: the name and a menu button that opens the links
// in a panel below it; from the small breakpoint up the links sit in the line as they are. The links
// are in the page once, so the same names work at every width.
export function HeaderMenu({ label, children }: { label: string; children: ReactNode }) {
  const [open, setOpen] = useState(false);
  return (
    <>
      <button
        type="button"
        aria-expanded={open}
        aria-controls="site-menu"
        onClick={() => setOpen((o) => !o)}
        className="inline-flex min-h-touch items-center gap-2 rounded-md border-2 border-paper px-3 font-semibold sm:hidden"
      >
        <span aria-hidden="true">☰</span>
        {label}
      </button>
      <div
        id="site-menu"
        // A followed link closes the menu (the next page starts with it closed).
        onClick={(e) => {
          if ((e.target as HTMLElement).closest("a")) setOpen(false);
        }}
        className={`${open ? "flex" : "hidden"} absolute end-0 top-full z-30 mt-1 min-w-56 flex-col items-start gap-1 rounded-md border-2 border-heath-400 bg-reed-800 p-2 shadow-lg sm:static sm:mt-0 sm:flex sm:min-w-0 sm:flex-row sm:flex-wrap sm:items-center sm:border-0 sm:p-0 sm:shadow-none`}
      >
        {children}
      </div>
    </>
  );
}
