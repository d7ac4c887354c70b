import type { ReactNode } from "react";

/** Sign-in and sign-up: one calm card beside a short reminder of what the product is for. */
export default function AuthLayout({ children }: { children: ReactNode }) {
  return (
    <div className="mx-auto grid max-w-5xl gap-10 px-4 py-10 sm:px-6 md:grid-cols-[1fr_26rem] md:py-16">
      <aside className="hidden flex-col justify-center md:flex">
        <p className="text-board-600 text-caption font-mono tracking-widest uppercase">Phasewright</p>
        <p className="text-headline text-ink-900 mt-3 max-w-sm font-semibold">
          Evidence for every network before the board is built.
        </p>
        <ul className="text-ink-600 mt-6 space-y-2">
          <li>• Sweep magnitude and phase on the server.</li>
          <li>• Keep every run, comment and verdict with the team.</li>
          <li>• Compare revisions side by side.</li>
        </ul>
      </aside>
      <div className="rounded-panel border-paper-200 shadow-panel border bg-white p-6 sm:p-8">{children}</div>
    </div>
  );
}
