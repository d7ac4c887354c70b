import { TickedText } from "@/components/ui/ticked-text";
import type { OscillatorVerdict as Verdict } from "./oscillator-grade";

const TONES: Record<Verdict["kind"], { box: string; badge: string; label: string }> = {
  starts: { box: "border-signal-ok/40 bg-signal-ok-soft", badge: "bg-signal-ok text-white", label: "Starts" },
  marginal: {
    box: "border-signal-warn/40 bg-signal-warn-soft",
    badge: "bg-signal-warn text-white",
    label: "Marginal",
  },
  decays: {
    box: "border-signal-fault/40 bg-signal-fault-soft",
    badge: "bg-signal-fault text-white",
    label: "Won't start",
  },
  unknown: { box: "border-paper-300 bg-paper-50", badge: "bg-ink-500 text-white", label: "Unclear" },
};

/** The oscillator verdict: loop gain at its zero-phase frequency together with the dominant poles. */
export function OscillatorVerdictCard({ verdict }: { verdict: Verdict }) {
  const tone = TONES[verdict.kind];
  return (
    <section aria-labelledby="verdict-title" className={`rounded-panel border p-4 ${tone.box}`}>
      <div className="flex flex-wrap items-center gap-3">
        <span
          className={`text-caption rounded-full px-2.5 py-0.5 font-semibold tracking-wide uppercase ${tone.badge}`}
        >
          {tone.label}
        </span>
        <h3 id="verdict-title" className="text-ink-900 text-lead font-semibold" data-testid="osc-verdict">
          Oscillation {verdict.headline}
        </h3>
      </div>
      <p className="text-ink-700 mt-2 text-sm">
        <TickedText text={verdict.detail} />
      </p>
    </section>
  );
}
