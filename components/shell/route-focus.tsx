"use client";

import { usePathname } from "next/navigation";
import { useEffect, useRef } from "react";

/**
 * After a client-side navigation to another page, move keyboard focus to the page's main region,
 * as a full page load would start there: the next Tab reaches the new page's first control, and a
 * screen reader continues from the new content (the framework's route announcer reads its title).
 * A control inside the new page that already took focus keeps it; query-string changes (filters,
 * sorting, paging) are not page changes and leave focus where it is.
 */
export function RouteFocus() {
  const pathname = usePathname();
  const previous = useRef(pathname);
  useEffect(() => {
    if (previous.current === pathname) return;
    previous.current = pathname;
    const main = document.getElementById("main");
    if (!main) return;
    const active = document.activeElement;
    if (active && active !== main && main.contains(active)) return;
    main.focus({ preventScroll: true });
  }, [pathname]);
  return null;
}
