"use client";

import { keepPreviousData, useQuery } from "@tanstack/react-query";
import { useEffect, useRef, useState } from "react";
import type { SolveResult, SolveSuccess } from "@/solver/types";
import type { PreviewInput } from "./preview-view";

/** The text after it has stayed unchanged for `delayMs`. */
function useDebounced(text: string, delayMs: number): string {
  const [settled, setSettled] = useState(text);
  useEffect(() => {
    const t = setTimeout(() => setSettled(text), delayMs);
    return () => clearTimeout(t);
  }, [text, delayMs]);
  return settled;
}

async function solvePreview(netlist: string, signal: AbortSignal): Promise<SolveResult> {
  let res: Response;
  try {
    res = await fetch("/api/solve", {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ netlist }),
      signal,
    });
  } catch (err) {
    if (signal.aborted) throw err;
    throw new Error("the preview could not reach the server.");
  }
  const body = (await res.json().catch(() => null)) as SolveResult | { error?: { message?: string } } | null;
  if (!res.ok || !body || !("ok" in body)) {
    const message = body && "error" in body ? body.error?.message : undefined;
    throw new Error(message ?? `the preview failed (HTTP ${res.status}).`);
  }
  return body;
}

/**
 * The live preview through the query cache: the netlist is solved by `POST /api/solve` once it has
 * rested `delayMs`; the key is the text itself, so a change aborts the request in flight (the query's
 * signal) and typing back to an earlier text shows its cached answer at once. Returns what
 * `previewView` needs; the view decides what may be shown.
 */
export function useLiveSolve(netlist: string, delayMs = 300): Omit<PreviewInput, "saveErrors"> {
  const settled = useDebounced(netlist, delayMs);
  const query = useQuery({
    queryKey: ["preview", settled],
    queryFn: async ({ signal }) => ({ text: settled, result: await solvePreview(settled, signal) }),
    enabled: settled.trim() !== "",
    placeholderData: keepPreviousData,
    staleTime: Number.POSITIVE_INFINITY,
    gcTime: 60_000,
  });
  const lastGood = useRef<{ text: string; result: SolveSuccess } | null>(null);
  const answer = query.data ?? null;
  if (answer?.result.ok) lastGood.current = { text: answer.text, result: answer.result };
  return {
    text: netlist,
    answer,
    lastGood: lastGood.current,
    pending: settled !== netlist || query.isFetching,
    failure: query.isError && !query.isFetching ? query.error.message : null,
  };
}
