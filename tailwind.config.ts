import type { Config } from "tailwindcss";

/**
 * Phasewright's visual language: warm drafting paper, graphite ink, a deep board-green for
 * structure and actions, and a copper accent for focus and highlights.
 */
const config = {
  content: ["./app/**/*.{ts,tsx}", "./components/**/*.{ts,tsx}", "./lib/**/*.{ts,tsx}"],
  theme: {
    extend: {
      colors: {
        paper: {
          50: "#fbfaf7",
          100: "#f4f2ec",
          200: "#e8e4da",
          300: "#d5cfc1",
          400: "#b9b1a0",
        },
        ink: {
          300: "#a3aeaf",
          400: "#7d8b8d",
          500: "#5c6b6d",
          600: "#465457",
          700: "#313e41",
          800: "#212c2f",
          900: "#151e20",
          950: "#0c1314",
        },
        board: {
          50: "#ebf5f2",
          100: "#cfe7e0",
          200: "#a0cfc3",
          300: "#68b0a0",
          400: "#3c9180",
          500: "#207766",
          600: "#175f52",
          700: "#134c43",
          800: "#113d37",
          900: "#0e302c",
        },
        copper: {
          50: "#fcf2ea",
          100: "#f7dfca",
          200: "#eebd94",
          300: "#e0955a",
          400: "#cf7636",
          500: "#b55e22",
          600: "#954b1b",
          700: "#773c19",
        },
        signal: {
          ok: "#1d7349",
          warn: "#9a6205",
          fault: "#b0271f",
          "ok-soft": "#e4f3ea",
          "warn-soft": "#fbf0d9",
          "fault-soft": "#fbe6e4",
        },
      },
      fontFamily: {
        sans: ['"Inter Variable"', "Inter", "ui-sans-serif", "system-ui", "sans-serif"],
        mono: ['"JetBrains Mono"', "ui-monospace", "SFMono-Regular", "monospace"],
      },
      fontSize: {
        caption: ["0.75rem", { lineHeight: "1rem", letterSpacing: "0.02em" }],
        body: ["0.9375rem", { lineHeight: "1.5rem" }],
        lead: ["1.125rem", { lineHeight: "1.75rem" }],
        title: ["1.5rem", { lineHeight: "2rem", letterSpacing: "-0.01em" }],
        headline: ["2rem", { lineHeight: "2.5rem", letterSpacing: "-0.015em" }],
        display: ["2.75rem", { lineHeight: "3.1rem", letterSpacing: "-0.02em" }],
      },
      borderRadius: {
        panel: "0.625rem",
      },
      boxShadow: {
        panel: "0 1px 0 rgba(21, 30, 32, 0.04), 0 1px 3px rgba(21, 30, 32, 0.08)",
      },
    },
  },
} satisfies Config;

export default config;
