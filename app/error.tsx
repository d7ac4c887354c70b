"use client";

import { useRouter } from "next/navigation";
import { startTransition, useEffect } from "react";
import { Button } from "@/components/ui/button";
import { DB_UNAVAILABLE_DIGEST } from "@/lib/errors";

/** Any page failure: a friendly explanation, never a stack trace. A database outage is named as such. */
export default function ErrorPage({
  error,
  reset,
}: {
  error: Error & { digest?: string };
  reset: () => void;
}) {
  const dbDown =
    error.digest === DB_UNAVAILABLE_DIGEST || /database is not reachable|ECONNREFUSED/i.test(error.message);
  const router = useRouter();
  // Re-fetch the server part of the page, then re-render it.
  const retry = () =>
    startTransition(() => {
      router.refresh();
      reset();
    });
  useEffect(() => {
    console.error(error);
  }, [error]);
  return (
    <div className="mx-auto max-w-xl px-4 py-20 text-center sm:px-6">
      <p className="text-caption text-copper-600 font-mono tracking-widest uppercase">
        {dbDown ? "Database unavailable" : "Unexpected error"}
      </p>
      <h1 className="text-headline text-ink-950 mt-3 font-semibold">
        {dbDown ? "We can't reach the database just now" : "Something went wrong on our side"}
      </h1>
      <p className="text-ink-600 mt-3">
        {dbDown
          ? "Your runs and comments are safe; the service that stores them is not answering. Try again in a minute."
          : "The page could not be shown. Nothing you saved was lost. Try again, and tell your administrator if it keeps happening."}
      </p>
      {error.digest && !dbDown ? (
        <p className="text-caption text-ink-500 mt-2 font-mono">ref {error.digest}</p>
      ) : null}
      <Button className="mt-8" onClick={retry}>
        Try again
      </Button>
    </div>
  );
}
