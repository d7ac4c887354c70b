import { AppError, isDatabaseConnectionError } from "@/lib/errors";

/** What a form's server action hands back: field errors, a message, and whether it worked. */
export type FormState = {
  ok: boolean;
  message?: string;
  errors?: Record<string, string[]>;
  /** Something to show once (a new API token). */
  secret?: string;
  /** What was submitted, so a failed form shows it again (React resets a form after its action). */
  values?: Record<string, string>;
};

export const initialFormState: FormState = { ok: false };

/** Maps a failure in a server action to a form state; unknown failures are logged, never shown. */
export function failureState(err: unknown, where: string): FormState {
  if (err instanceof AppError) {
    const fields = err.details?.fields as Record<string, string[]> | undefined;
    // Field errors sit beside their fields; the summary then only points at them.
    if (fields) return { ok: false, message: "Check the highlighted fields.", errors: fields };
    return { ok: false, message: err.message };
  }
  if (isDatabaseConnectionError(err)) {
    return {
      ok: false,
      message: "The database is not reachable right now. Nothing was saved; try again shortly.",
    };
  }
  console.error(`[${where}]`, err);
  return { ok: false, message: "Something went wrong on our side. Nothing was saved." };
}

export { issuesToFields } from "@/lib/utils";

/** The text fields of a submission, for `FormState.values`. */
export function formValues(formData: FormData, names: readonly string[]): Record<string, string> {
  const out: Record<string, string> = {};
  for (const n of names) {
    const v = formData.get(n);
    if (typeof v === "string") out[n] = v;
  }
  return out;
}
