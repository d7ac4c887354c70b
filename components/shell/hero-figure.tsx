/** A decorative sketch: a band-pass response and its phase crossing zero at the peak. */
export function HeroFigure() {
  return (
    <svg
      viewBox="0 0 360 220"
      className="rounded-panel border-paper-200 shadow-panel h-auto w-full border bg-white"
      aria-hidden="true"
    >
      <defs>
        <pattern id="grid" width="30" height="22" patternUnits="userSpaceOnUse">
          <path d="M30 0H0V22" fill="none" className="stroke-paper-200" strokeWidth="1" />
        </pattern>
      </defs>
      <rect x="20" y="16" width="320" height="176" fill="url(#grid)" />
      <line x1="20" y1="104" x2="340" y2="104" className="stroke-paper-300" strokeDasharray="3 3" />
      <path
        d="M20 170 C 90 160, 130 120, 170 62 C 178 50, 186 50, 194 62 C 234 120, 280 160, 340 172"
        fill="none"
        className="stroke-board-600"
        strokeWidth="2.5"
      />
      <path
        d="M20 40 C 120 44, 150 70, 182 104 C 214 138, 244 164, 340 168"
        fill="none"
        className="stroke-copper-400"
        strokeWidth="2"
        strokeDasharray="6 4"
      />
      <circle cx="182" cy="104" r="5" className="fill-copper-500" />
      <line x1="182" y1="16" x2="182" y2="192" className="stroke-copper-300" strokeWidth="1" />
      <text x="190" y="30" className="fill-ink-600 font-mono" fontSize="10">
        ∠ = 0°
      </text>
      <text x="24" y="208" className="fill-ink-400 font-mono" fontSize="9">
        log f
      </text>
    </svg>
  );
}
