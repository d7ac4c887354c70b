"use client";

import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/notice";

/** Shown when the editor page fails to load (e.g. the database is down). */
export default function NewRunError({ reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <div className="mx-auto max-w-3xl px-4 py-12 sm:px-6">
      <Notice tone="fault" title="The editor could not be opened.">
        The service could not check this project just now. Any draft you typed is kept in this browser; try
        again in a moment.
      </Notice>
      <Button className="mt-4" variant="secondary" onClick={reset}>
        Try again
      </Button>
    </div>
  );
}
