"use client";

import { useActionState } from "react";
import { Button } from "@/components/ui/button";
import { revokeTokenAction } from "@/lib/actions/settings";
import { initialFormState } from "@/lib/actions/state";
import type { ApiTokenSummary } from "@/lib/tokens";
import { formatDate } from "@/lib/utils";

function RevokeButton({ token }: { token: ApiTokenSummary }) {
  const [state, action, pending] = useActionState(revokeTokenAction, initialFormState);
  return (
    <form action={action} className="flex items-center gap-2">
      <input type="hidden" name="tokenId" value={token.id} />
      <Button
        type="submit"
        size="sm"
        variant="danger"
        disabled={pending}
        aria-label={`Revoke token ${token.name}`}
      >
        {pending ? "Revoking…" : "Revoke"}
      </Button>
      <span aria-live="polite" className="text-caption text-signal-fault">
        {state.ok ? "" : (state.message ?? "")}
      </span>
    </form>
  );
}

export function TokenList({ tokens }: { tokens: ApiTokenSummary[] }) {
  if (tokens.length === 0) return <p className="text-ink-500 text-sm">No tokens yet.</p>;
  return (
    <ul className="divide-paper-200 border-paper-200 divide-y rounded-md border">
      {tokens.map((t) => (
        <li key={t.id} className="flex flex-col gap-2 px-4 py-3 sm:flex-row sm:items-center">
          <div className="min-w-0 flex-1">
            <p className="text-ink-900 truncate font-medium">
              {t.name}
              {t.revokedAt ? (
                <span className="text-caption text-signal-fault ml-2 font-normal">revoked</span>
              ) : null}
            </p>
            <p className="text-caption text-ink-500 font-mono">
              {t.prefix}… · created {formatDate(t.createdAt)} · last used{" "}
              {t.lastUsedAt ? formatDate(t.lastUsedAt) : "never"}
            </p>
          </div>
          {t.revokedAt ? null : <RevokeButton token={t} />}
        </li>
      ))}
    </ul>
  );
}
