"use client";

import { usePathname } from "next/navigation";
import { useState, type ReactNode } from "react";

/**
 * On a phone the menu folds away behind a Menu button and folds again after each navigation; from
 * the md breakpoint up it is always open beside the page.
 */
export function NavFold({ children }: { children: ReactNode }) {
  const pathname = usePathname();
  const [open, setOpen] = useState(false);
  const [openedAt, setOpenedAt] = useState(pathname);
  // Derived during render (not in an effect): a new page closes the menu.
  if (openedAt !== pathname) {
    setOpenedAt(pathname);
    setOpen(false);
  }
  return (
    <>
      <button
        type="button" aria-expanded={open} aria-controls="main-menu" onClick={() => setOpen(!open)}
        className="absolute right-4 top-4 rounded-md px-3 py-1.5 text-sm font-semibold text-white ring-1 ring-ink-600 md:hidden"
      >
        {open ? "Close menu" : "Menu"}
      </button>
      <div id="main-menu" data-testid="main-menu" className={`${open ? "block" : "hidden"} md:block`}>{children}</div>
    </>
  );
}
