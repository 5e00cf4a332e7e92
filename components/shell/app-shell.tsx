import Link from "next/link";
import type { ReactNode } from "react";
import type { SessionUser } from "@/lib/auth/options";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { navFor } from "./nav-items";
import { NavFold } from "./nav-fold";
import { NavLinks } from "./nav-links";
import { SignOutButton } from "./sign-out-button";

export function AppShell({ user, children }: { user: SessionUser; children: ReactNode }) {
  return (
    <div className="md:flex md:min-h-screen">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-50 focus:bg-white focus:px-3 focus:py-2">
        Skip to content
      </a>
      <nav aria-label="Main" className="relative bg-ink-900 px-4 py-4 md:w-60 md:shrink-0">
        <Link href="/" className="block text-xl font-bold tracking-tight text-white no-underline md:mb-4">
          Em<span className="text-copper-400">folio</span>
        </Link>
        <NavFold>
          <div className="mt-4 md:mt-0"><NavLinks items={navFor(user.role)} /></div>
          <div className="mt-6 border-t border-ink-800 pt-4 text-xs text-ink-200">
            <p className="font-semibold text-white" data-testid="signed-in-as">{user.name}</p>
            <p>{ROLE_LABELS[user.role]} · {user.organisationName}</p>
            <p className="mt-1"><Link href="/account" className="text-ink-200">Your sessions</Link></p>
            <div className="mt-3">
              <SignOutButton />
            </div>
          </div>
        </NavFold>
      </nav>
      <main id="main" className="flex-1 px-4 py-6 md:px-8">
        <div className="mx-auto max-w-6xl">{children}</div>
      </main>
    </div>
  );
}
