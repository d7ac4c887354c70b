import Link from "next/link";
import { HeroFigure } from "@/components/shell/hero-figure";
import { buttonClass } from "@/components/ui/button-class";
import { getActor } from "@/lib/session";

export default async function LandingPage() {
  const actor = await getActor();
  return (
    <div className="mx-auto grid max-w-6xl items-center gap-12 px-4 py-14 sm:px-6 md:grid-cols-[1.1fr_1fr] md:py-24">
      <section aria-labelledby="landing-title">
        <p className="text-board-600 text-caption font-mono tracking-widest uppercase">
          AC analysis for teams
        </p>
        <h1 id="landing-title" className="text-display text-ink-950 mt-3 font-semibold">
          Show the network works before the board is built.
        </h1>
        <p className="text-ink-700 text-lead mt-5 max-w-xl">
          Phasewright solves your circuit, written as a short plain-text netlist, with modified nodal analysis
          on the server and plots its magnitude, phase and loop gain. Your team keeps every run, comment and
          review verdict in one place, so sign-off rests on evidence rather than screenshots.
        </p>
        <div className="mt-8 flex flex-wrap gap-3">
          {actor ? (
            <Link href="/projects" className={buttonClass({ size: "lg" })}>
              Open your projects
            </Link>
          ) : (
            <>
              <Link href="/signup" className={buttonClass({ size: "lg" })}>
                Create an account
              </Link>
              <Link href="/signin" className={buttonClass({ size: "lg", variant: "secondary" })}>
                Sign in
              </Link>
            </>
          )}
        </div>
      </section>
      <HeroFigure />
    </div>
  );
}
