"use client";

import { useSyncExternalStore } from "react";

const subscribe = () => () => {};

/**
 * False while the server-rendered HTML is on screen and React has not attached its handlers yet;
 * true from the first client render on. Controls that only work through a click handler stay
 * disabled until then, so an early click is not silently lost.
 */
export function useHydrated(): boolean {
  return useSyncExternalStore(
    subscribe,
    () => true,
    () => false,
  );
}
