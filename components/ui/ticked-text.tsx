import { Fragment } from "react";

/**
 * A solver message with its `quoted` netlist words shown as code rather than with raw back-ticks,
 * e.g. "unknown measure function `zork`" → unknown measure function <code>zork</code>.
 */
export function TickedText({ text }: { text: string }) {
  const parts = text.split("`");
  // An odd number of back-ticks: leave the text as it is rather than guess.
  if (parts.length < 3 || parts.length % 2 === 0) return <>{text}</>;
  return (
    <>
      {parts.map((part, i) =>
        i % 2 === 1 ? (
          <code key={i} className="bg-paper-100 rounded px-1 text-[0.95em]">
            {part}
          </code>
        ) : (
          <Fragment key={i}>{part}</Fragment>
        ),
      )}
    </>
  );
}
