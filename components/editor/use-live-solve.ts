"use client";

import { useEffect, useRef, useState } from "react";
import type { SolveResult } from "@/solver/types";

export type LiveSolveState =
  | { status: "idle" }
  | { status: "loading"; last: SolveResult | null }
  | { status: "done"; result: SolveResult }
  | { status: "error"; message: string; last: SolveResult | null };

/**
 * Solves the netlist through `POST /api/solve` while the user types: waits `delayMs` after the last
 * change, aborts the request still in flight, and keeps the last result on screen while loading.
 */
export function useLiveSolve(netlist: string, delayMs = 300): LiveSolveState {
  const [state, setState] = useState<LiveSolveState>({ status: "idle" });
  const lastRef = useRef<SolveResult | null>(null);

  useEffect(() => {
    if (netlist.trim() === "") {
      setState({ status: "idle" });
      return;
    }
    const controller = new AbortController();
    const timer = setTimeout(async () => {
      setState({ status: "loading", last: lastRef.current });
      try {
        const res = await fetch("/api/solve", {
          method: "POST",
          headers: { "content-type": "application/json" },
          body: JSON.stringify({ netlist }),
          signal: controller.signal,
        });
        const body = (await res.json().catch(() => null)) as
          | (SolveResult & { error?: undefined })
          | { error: { message: string } }
          | null;
        if (!res.ok || !body || "error" in body) {
          const message =
            body && "error" in body && body.error
              ? body.error.message
              : `The preview failed (HTTP ${res.status}).`;
          setState({ status: "error", message, last: lastRef.current });
          return;
        }
        lastRef.current = body as SolveResult;
        setState({ status: "done", result: body as SolveResult });
      } catch (err) {
        if (controller.signal.aborted) return;
        setState({
          status: "error",
          message:
            err instanceof Error
              ? `The preview could not reach the server: ${err.message}`
              : "Preview failed.",
          last: lastRef.current,
        });
      }
    }, delayMs);
    return () => {
      clearTimeout(timer);
      controller.abort();
    };
  }, [netlist, delayMs]);

  return state;
}
