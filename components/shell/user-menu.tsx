"use client";

import Link from "next/link";
import { signOut } from "next-auth/react";
import { useEffect, useRef, useState } from "react";
import { PlainButton } from "@/components/ui/button";

/** The account menu: who is signed in, a link to settings, and sign out. Closes on Escape or outside click. */
export function UserMenu({ name, email }: { name: string; email: string }) {
  const [open, setOpen] = useState(false);
  const root = useRef<HTMLDivElement>(null);
  const button = useRef<HTMLButtonElement>(null);
  const initials =
    name
      .split(/\s+/)
      .filter(Boolean)
      .slice(0, 2)
      .map((p) => p[0]?.toUpperCase())
      .join("") || "?";

  useEffect(() => {
    if (!open) return;
    const onKey = (e: KeyboardEvent) => {
      if (e.key === "Escape") {
        setOpen(false);
        button.current?.focus();
      }
    };
    const onClick = (e: MouseEvent) => {
      if (root.current && !root.current.contains(e.target as Node)) setOpen(false);
    };
    document.addEventListener("keydown", onKey);
    document.addEventListener("mousedown", onClick);
    return () => {
      document.removeEventListener("keydown", onKey);
      document.removeEventListener("mousedown", onClick);
    };
  }, [open]);

  return (
    <div ref={root} className="relative">
      <PlainButton
        ref={button}
        type="button"
        aria-expanded={open}
        aria-controls="user-menu"
        aria-label={`Account menu for ${name}`}
        onClick={() => setOpen((v) => !v)}
        className="bg-copper-100 text-copper-700 hover:bg-copper-200 flex h-9 w-9 items-center justify-center rounded-full text-sm font-semibold"
      >
        {initials}
      </PlainButton>
      {open ? (
        <div
          id="user-menu"
          className="rounded-panel border-paper-200 absolute right-0 z-30 mt-2 w-64 border bg-white p-2 shadow-lg"
        >
          <div className="border-paper-200 border-b px-3 pt-1 pb-2">
            <p className="text-ink-900 truncate font-medium">{name}</p>
            <p className="text-ink-500 truncate text-sm">{email}</p>
          </div>
          <Link
            href="/settings"
            onClick={() => setOpen(false)}
            className="text-ink-700 hover:bg-paper-100 mt-1 block rounded-md px-3 py-2 text-sm"
          >
            Profile and API tokens
          </Link>
          <PlainButton
            type="button"
            onClick={() => signOut({ callbackUrl: "/" })}
            className="text-ink-700 hover:bg-paper-100 block w-full rounded-md px-3 py-2 text-left text-sm"
          >
            Sign out
          </PlainButton>
        </div>
      ) : null}
    </div>
  );
}
