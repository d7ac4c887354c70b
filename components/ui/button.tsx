"use client";

import type { ButtonHTMLAttributes, ComponentProps } from "react";
import { type ButtonSize, type ButtonVariant, buttonClass } from "./button-class";
import { useHydrated } from "./use-hydrated";

export type ButtonProps = ButtonHTMLAttributes<HTMLButtonElement> & {
  variant?: ButtonVariant;
  size?: ButtonSize;
};

/**
 * A button of our visual language. A plain (non-submit) button that acts through `onClick` is
 * disabled until the page has hydrated: before that its click would do nothing. Submit buttons
 * work without JavaScript (server actions), so they are never held back.
 */
export function Button({ variant, size, className, type = "button", disabled, ...props }: ButtonProps) {
  const hydrated = useHydrated();
  const waiting = type === "button" && props.onClick !== undefined && !hydrated;
  return (
    <button
      type={type}
      className={buttonClass({ variant, size, className })}
      disabled={disabled || waiting}
      {...props}
    />
  );
}

/**
 * A button with no look of its own (a link-like or icon control styled by its caller), under the
 * same rule as `Button`: a plain button that acts through `onClick` is disabled until hydration.
 * Every `<button>` outside components/ui is one of these two (tests/unit/hydration-rule.test.ts).
 */
export function PlainButton({ type = "button", disabled, ...props }: ComponentProps<"button">) {
  const hydrated = useHydrated();
  const waiting = type === "button" && props.onClick !== undefined && !hydrated;
  return <button type={type} disabled={disabled || waiting} {...props} />;
}
