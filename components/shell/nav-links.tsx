"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";
import { cn } from "@/lib/utils";

const LINKS = [
  { href: "/projects", label: "Projects" },
  { href: "/teams", label: "Teams" },
  { href: "/settings", label: "Settings" },
] as const;

/** Main navigation; the current section is marked for sight and for screen readers. */
export function NavLinks({ className }: { className?: string }) {
  const pathname = usePathname() ?? "";
  return (
    <ul className={cn("flex items-center gap-1", className)}>
      {LINKS.map(({ href, label }) => {
        const active = pathname === href || pathname.startsWith(`${href}/`);
        return (
          <li key={href}>
            <Link
              href={href}
              aria-current={active ? "page" : undefined}
              className={cn(
                "block rounded-md px-3 py-1.5 text-sm font-medium transition-colors",
                active ? "bg-board-50 text-board-800" : "text-ink-600 hover:bg-paper-200 hover:text-ink-900",
              )}
            >
              {label}
            </Link>
          </li>
        );
      })}
    </ul>
  );
}
