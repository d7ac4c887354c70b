import { cn } from "@/lib/utils";

export interface CautionProps {
  className?: string;
}

/** The limits of what a result can tell, shown wherever results are. */
export function Caution({ className }: CautionProps) {
  return (
    <aside
      aria-label="What these results can and cannot tell you"
      className={cn(
        "border-paper-300 border-l-copper-400 bg-paper-50 text-ink-700 rounded-md border border-l-4 px-4 py-3 text-sm",
        className,
      )}
    >
      <p>
        <strong className="text-ink-900 font-semibold">
          Read these numbers as a model, not a measurement.
        </strong>{" "}
        Sweeps, loops, poles and noise are a small-signal, linear picture around one operating point. A steady
        analysis (harmonic balance) sizes only the limiters written in the netlist — diodes and op-amp swing —
        with ideal models; real parts add their own clipping, drift and distortion. Build it and measure it on
        the bench before you rely on it. Anything connected to mains voltage must be designed and checked by
        qualified people under the electrical codes that apply where it is used.
      </p>
    </aside>
  );
}
