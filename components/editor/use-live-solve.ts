"use client";

import { keepPreviousData, type QueryClient, useQuery, useQueryClient } from "@tanstack/react-query";
import { useEffect, useRef, useState } from "react";
import { keepSweepOf, type PreviewResult, type PreviewStage } from "@/lib/preview-stages";
import type { SolveSuccess } from "@/solver/types";
import type { PreviewInput } from "./preview-view";

/**
 * The text after it has stayed unchanged for `delayMs`, counted from the render that first saw it
 * (not from the effect after it, which runs only once the keystroke's frame is painted). `onSettle`
 * runs in the timer itself, before the render the settled text causes, so the preview's request
 * leaves without waiting for that render.
 */
function useDebounced(text: string, delayMs: number, onSettle: (text: string) => void): string {
  const [settled, setSettled] = useState(text);
  const settle = useRef(onSettle);
  settle.current = onSettle;
  const seen = useRef({ text, at: 0 });
  if (seen.current.text !== text) seen.current = { text, at: performance.now() };
  useEffect(() => {
    const waited = seen.current.text === text ? performance.now() - seen.current.at : 0;
    const t = setTimeout(
      () => {
        settle.current(text);
        setSettled(text);
      },
      Math.max(0, delayMs - waited),
    );
    return () => clearTimeout(t);
  }, [text, delayMs]);
  return settled;
}

async function solvePreview(
  netlist: string,
  stage: PreviewStage,
  signal: AbortSignal,
): Promise<PreviewResult> {
  let res: Response;
  try {
    res = await fetch("/api/solve", {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ netlist, stage }),
      signal,
    });
  } catch (err) {
    if (signal.aborted) throw err;
    throw new Error("the preview could not reach the server.");
  }
  const body = (await res.json().catch(() => null)) as
    | PreviewResult
    | { error?: { message?: string } }
    | null;
  if (!res.ok || !body || !("ok" in body)) {
    const message = body && "error" in body ? body.error?.message : undefined;
    throw new Error(message ?? `the preview failed (HTTP ${res.status}).`);
  }
  return body;
}

/** A preview answer and the text it was solved from. */
export type PreviewAnswer = { text: string; result: PreviewResult };

const previewKey = (text: string) => ["preview", text] as const;

/** The preview query of one text: asked sweep first, then, when studies are pending, whole. */
function previewQuery(queryClient: QueryClient, text: string) {
  return {
    queryKey: previewKey(text),
    queryFn: async ({ signal }: { signal: AbortSignal }): Promise<PreviewAnswer> => {
      const first = await solvePreview(text, "sweep", signal);
      if (!first.ok || !first.pending?.length) return { text, result: first };
      queryClient.setQueryData<PreviewAnswer>(previewKey(text), { text, result: first });
      const whole = await solvePreview(text, "all", signal);
      return { text, result: whole.ok ? keepSweepOf(first, whole) : whole };
    },
    staleTime: Number.POSITIVE_INFINITY,
    gcTime: 60_000,
  };
}

/**
 * The live preview through the query cache: the netlist is solved by `POST /api/solve` once it has
 * rested `delayMs` (the request leaves from the debounce's timer); the key is the text itself, so a change aborts the request in flight (the query's
 * signal) and typing back to an earlier text shows its cached answer at once. Each text is asked
 * sweep first (lib/preview-stages.ts): that answer goes into the cache at once, and when it names
 * studies still to come the same query asks for the whole preview, which then replaces it.
 * `initial` is the server's answer for the page's first text (the editor page solves it while it
 * renders), so that text needs no request. Returns what `previewView` needs; the view decides what
 * may be shown.
 */
export function useLiveSolve(
  netlist: string,
  { delayMs = 300, initial = null }: { delayMs?: number; initial?: PreviewAnswer | null } = {},
): Omit<PreviewInput, "saveErrors"> {
  const queryClient = useQueryClient();
  const settled = useDebounced(netlist, delayMs, (text) => {
    if (text.trim() !== "") void queryClient.prefetchQuery(previewQuery(queryClient, text));
  });
  const query = useQuery({
    ...previewQuery(queryClient, settled),
    initialData: initial && initial.text === settled ? initial : undefined,
    enabled: settled.trim() !== "",
    placeholderData: keepPreviousData,
  });
  const lastGood = useRef<{ text: string; result: SolveSuccess } | null>(null);
  const lastComplete = useRef<{ text: string; result: SolveSuccess } | null>(null);
  const answer = query.data ?? null;
  if (answer?.result.ok) {
    lastGood.current = { text: answer.text, result: answer.result };
    if (!answer.result.pending?.length) lastComplete.current = lastGood.current;
  }
  return {
    text: netlist,
    answer,
    lastGood: lastGood.current,
    lastComplete: lastComplete.current,
    pending: settled !== netlist || query.isFetching,
    failure: query.isError && !query.isFetching ? query.error.message : null,
  };
}
