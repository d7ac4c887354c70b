"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { useHydrated } from "@/components/ui/use-hydrated";
import type { NetlistError } from "@/solver/types";

export interface SaveRunFormProps {
  projectId: string;
  netlist: string;
  /** Called with the netlist errors of a 422 answer (shown as markers), or [] when saving again. */
  onNetlistErrors: (errors: NetlistError[]) => void;
  disabled?: boolean;
  /** The run this one revises: saved with `supersedesId`, and the title field suggests a revision title. */
  supersedes?: { id: string; title: string };
  /** Used when the title field is empty and the save comes from "Run full analysis" (the netlist's title). */
  fallbackTitle?: string;
}

/** The form's id: "Run full analysis" in the preview submits it. */
export const SAVE_RUN_FORM_ID = "save-run-form";

type SaveState =
  | { status: "idle" }
  | { status: "saving" }
  | { status: "error"; message: string; field?: string };

/** Title field and "Save run": POST /api/projects/:id/runs, then open the new run. The netlist is never cleared. */
export function SaveRunForm({
  projectId,
  netlist,
  onNetlistErrors,
  disabled,
  supersedes,
  fallbackTitle,
}: SaveRunFormProps) {
  const router = useRouter();
  const hydrated = useHydrated();
  const [title, setTitle] = useState(supersedes ? `${supersedes.title} (revised)`.slice(0, 200) : "");
  const [state, setState] = useState<SaveState>({ status: "idle" });

  async function save(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const full = (e.nativeEvent as SubmitEvent).submitter === null && fallbackTitle ? fallbackTitle : "";
    const chosen = title.trim() || full.trim();
    if (chosen === "") {
      setState({ status: "error", field: "title", message: "Give the run a title." });
      return;
    }
    setState({ status: "saving" });
    onNetlistErrors([]);
    try {
      const res = await fetch(`/api/projects/${encodeURIComponent(projectId)}/runs`, {
        method: "POST",
        headers: { "content-type": "application/json" },
        body: JSON.stringify({
          title: chosen.slice(0, 200),
          netlist,
          ...(supersedes ? { supersedesId: supersedes.id } : {}),
        }),
      });
      const body = (await res.json().catch(() => null)) as Record<string, unknown> | null;
      if (res.ok) {
        const run = (body?.run ?? body) as { id?: string } | null;
        if (run?.id) {
          router.push(`/runs/${run.id}`);
          return;
        }
        setState({ status: "error", message: "The run was saved, but the answer had no run id." });
        return;
      }
      const error = (body?.error ?? {}) as { message?: string; details?: Record<string, unknown> };
      if (res.status === 422) {
        const errors = (error.details?.errors ?? []) as NetlistError[];
        onNetlistErrors(errors);
        setState({
          status: "error",
          message: `Not saved: the netlist has ${errors.length} ${errors.length === 1 ? "error" : "errors"} (marked in the editor).`,
        });
        return;
      }
      const fields = (error.details?.fields ?? {}) as Record<string, string[]>;
      const field = Object.keys(fields)[0];
      setState({
        status: "error",
        field,
        message: (field && fields[field]?.[0]) || error.message || `Saving failed (HTTP ${res.status}).`,
      });
    } catch {
      setState({
        status: "error",
        message: "Could not reach the server. Your netlist is still here; try again.",
      });
    }
  }

  const titleInvalid = state.status === "error" && state.field === "title";
  return (
    <form id={SAVE_RUN_FORM_ID} onSubmit={save} className="flex flex-wrap items-start gap-2" noValidate>
      <label htmlFor="run-title" className="sr-only">
        Run title
      </label>
      <input
        id="run-title"
        name="title"
        value={title}
        onChange={(e) => setTitle(e.target.value)}
        maxLength={200}
        placeholder="Run title, e.g. “Rf raised to 24k”"
        aria-invalid={titleInvalid || undefined}
        aria-describedby="save-run-status"
        className="border-paper-300 aria-invalid:border-signal-fault h-10 min-w-0 flex-1 rounded-md border bg-white px-3 text-sm"
      />
      <Button type="submit" disabled={disabled || !hydrated || state.status === "saving"}>
        {state.status === "saving" ? "Saving…" : supersedes ? "Save revision" : "Save run"}
      </Button>
      <p
        id="save-run-status"
        role="status"
        aria-live="polite"
        className="text-signal-fault basis-full text-sm empty:hidden"
      >
        {state.status === "error" ? state.message : ""}
      </p>
    </form>
  );
}
