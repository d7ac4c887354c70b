import "@fontsource-variable/inter";
import "@fontsource/jetbrains-mono/400.css";
import "@fontsource/jetbrains-mono/600.css";
import "./globals.css";
import type { Metadata, Viewport } from "next";
import type { ReactNode } from "react";
import { QueryProvider } from "@/components/providers/query-provider";
import { RouteFocus } from "@/components/shell/route-focus";
import { SiteFooter } from "@/components/shell/site-footer";
import { SiteHeader } from "@/components/shell/site-header";
import { isDatabaseConnectionError } from "@/lib/errors";
import { getActor, getUserProfile } from "@/lib/session";

export const metadata: Metadata = {
  title: { default: "Phasewright", template: "%s · Phasewright" },
  description:
    "Write a network as text, sweep its AC response on the server, and review the evidence as a team.",
};

export const viewport: Viewport = { themeColor: "#134c43" };

/** A database outage must not break the frame around the page; the page itself then explains. */
function orNull(err: unknown): null {
  if (isDatabaseConnectionError(err)) return null;
  throw err;
}

export default async function RootLayout({ children }: { children: ReactNode }) {
  // A bearer lookup may fail when the database is down; the page itself then shows why.
  const actor = await getActor().catch(orNull);
  // The token may carry an older name after a profile change: prefer the stored one.
  const profile = actor ? await getUserProfile(actor.userId).catch(orNull) : null;
  return (
    <html lang="en">
      <body className="flex min-h-dvh flex-col">
        <a
          href="#main"
          className="bg-ink-950 text-paper-50 sr-only z-50 rounded-md px-4 py-2 focus:not-sr-only focus:fixed focus:top-3 focus:left-3"
        >
          Skip to content
        </a>
        <SiteHeader actor={actor && profile ? { ...actor, ...profile } : actor} />
        <main id="main" tabIndex={-1} className="flex-1 outline-none">
          <QueryProvider>{children}</QueryProvider>
        </main>
        <SiteFooter />
        <RouteFocus />
      </body>
    </html>
  );
}
