import { type InputHTMLAttributes, type ReactNode, useId } from "react";
import { cn } from "@/lib/utils";

export const inputClass =
  "block w-full rounded-md border border-paper-300 bg-white px-3 py-2 text-body text-ink-900 shadow-xs placeholder:text-ink-500 hover:border-ink-300 focus-visible:border-board-500 aria-invalid:border-signal-fault";

/** A file input in our look: its button drawn like a secondary button, not the browser's stock one. */
export const fileInputClass =
  "block w-full text-sm text-ink-700 file:mr-3 file:rounded-md file:border file:border-paper-300 file:bg-white file:px-3 file:py-1.5 file:text-sm file:font-medium file:text-ink-900 hover:file:bg-paper-100";

export type FieldProps = InputHTMLAttributes<HTMLInputElement> & {
  label: string;
  name: string;
  hint?: ReactNode;
  errors?: string[] | undefined;
};

/** A labelled input; its errors are announced (aria-live) and tied to it with aria-describedby. */
export function Field({ label, name, hint, errors, className, id, ...props }: FieldProps) {
  const autoId = useId();
  const inputId = id ?? `${name}-${autoId.replace(/[^a-zA-Z0-9_-]/g, "")}`;
  const errorId = `${inputId}-error`;
  const hintId = `${inputId}-hint`;
  const invalid = Boolean(errors?.length);
  return (
    <div className={cn("space-y-1.5", className)}>
      <label htmlFor={inputId} className="text-ink-800 block text-sm font-medium">
        {label}
      </label>
      <input
        id={inputId}
        name={name}
        aria-invalid={invalid || undefined}
        aria-describedby={cn(hint && hintId, errorId) || undefined}
        className={inputClass}
        {...props}
      />
      {hint ? (
        <p id={hintId} className="text-caption text-ink-500">
          {hint}
        </p>
      ) : null}
      <FieldErrors id={errorId} errors={errors} />
    </div>
  );
}

export function FieldErrors({ id, errors }: { id: string; errors?: string[] | undefined }) {
  return (
    <div id={id} aria-live="polite" className="min-h-0">
      {errors?.map((e) => (
        <p key={e} className="text-signal-fault text-sm">
          {e}
        </p>
      ))}
    </div>
  );
}
