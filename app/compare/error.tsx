"use client";

import { Button } from "@/components/ui/button";
import { Notice } from "@/components/ui/notice";

/** Shown when the comparison fails (e.g. the database is down). */
export default function CompareError({ reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <div className="mx-auto max-w-3xl px-4 py-12 sm:px-6">
      <Notice tone="fault" title="The comparison could not be made.">
        Both runs are safe; the service could not read them just now. Try again in a moment.
      </Notice>
      <Button className="mt-4" variant="secondary" onClick={reset}>
        Try again
      </Button>
    </div>
  );
}
