import { cn } from "@/lib/utils";

export type ButtonVariant = "primary" | "secondary" | "ghost" | "danger";
export type ButtonSize = "sm" | "md" | "lg";

const VARIANTS: Record<ButtonVariant, string> = {
  primary: "bg-board-600 text-white hover:bg-board-700 active:bg-board-800 disabled:bg-board-400",
  secondary:
    "border border-paper-300 bg-white text-ink-800 hover:border-ink-300 hover:bg-paper-100 disabled:text-ink-500",
  ghost: "text-ink-700 hover:bg-paper-200 hover:text-ink-900 disabled:text-ink-500",
  danger:
    "border border-signal-fault/40 bg-white text-signal-fault hover:bg-signal-fault-soft disabled:border-paper-300 disabled:text-ink-500 disabled:hover:bg-white",
};

const SIZES: Record<ButtonSize, string> = {
  sm: "h-8 px-3 text-sm",
  md: "h-10 px-4 text-sm",
  lg: "h-12 px-6 text-base",
};

/** Class names of a button, for links that look like one. */
export function buttonClass(opts: { variant?: ButtonVariant; size?: ButtonSize; className?: string } = {}) {
  const { variant = "primary", size = "md", className } = opts;
  return cn(
    "inline-flex items-center justify-center gap-2 rounded-md font-medium whitespace-nowrap transition-colors select-none disabled:cursor-not-allowed",
    VARIANTS[variant],
    SIZES[size],
    className,
  );
}
