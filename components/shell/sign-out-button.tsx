"use client";

import { signOut } from "next-auth/react";

export function SignOutButton() {
  return (
    <button
      type="button"
      onClick={() => signOut({ callbackUrl: "/sign-in" })}
      className="rounded-md px-3 py-1.5 text-sm text-ink-100 ring-1 ring-ink-600 hover:bg-ink-800"
    >
      Sign out
    </button>
  );
}
