import Link from "next/link";
import { buttonClass } from "@/components/ui/button-class";
import type { Actor } from "@/lib/session";
import { Wordmark } from "./mark";
import { NavLinks } from "./nav-links";
import { UserMenu } from "./user-menu";

/** Top bar: mark, sections and the account menu; on a phone the sections drop to a second row. */
export function SiteHeader({ actor }: { actor: Actor | null }) {
  return (
    <header className="border-paper-200 bg-paper-50/90 sticky top-0 z-20 border-b backdrop-blur">
      <div className="mx-auto flex h-14 max-w-[96rem] items-center gap-6 px-4 sm:px-6">
        <Link href={actor ? "/projects" : "/"} aria-label="Phasewright home" className="rounded-md">
          <Wordmark />
        </Link>
        {actor ? (
          <nav aria-label="Main" className="hidden sm:block">
            <NavLinks />
          </nav>
        ) : null}
        <div className="ml-auto flex items-center gap-2">
          {actor ? (
            <UserMenu name={actor.name || actor.email} email={actor.email} />
          ) : (
            <>
              <Link href="/signin" className={buttonClass({ variant: "ghost", size: "sm" })}>
                Sign in
              </Link>
              <Link href="/signup" className={buttonClass({ size: "sm" })}>
                Create account
              </Link>
            </>
          )}
        </div>
      </div>
      {actor ? (
        <nav aria-label="Main (compact)" className="border-paper-200 border-t px-2 py-1.5 sm:hidden">
          <NavLinks />
        </nav>
      ) : null}
    </header>
  );
}
