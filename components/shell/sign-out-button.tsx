"use client";
import { signOut } from "next-auth/react";

export function SignOutButton() {
  return (
    <button
      type="button"
      onClick={() => signOut({ callbackUrl: "/sign-in" })}
      className="rounded-md px-2.5 py-1.5 text-sm text-ink-soft hover:bg-paper-sunk hover:text-ink"
    >
      Sign out
    </button>
  );
}
