"use client";

import { type QueryClient, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { apiErrorMessage } from "@/lib/api-error";
import type { CommentView } from "@/lib/comments";
import type { ThreadState } from "@/lib/review-states";

/**
 * A run's comments in the query cache: the page's server-rendered list seeds it, posting and settling
 * write their answer into it (so every view of the list agrees at once), and the list is read again
 * from the server after each change and when the page is revisited.
 */
export const commentsKey = (runId: string) => ["comments", runId] as const;

async function readComments(runId: string, signal: AbortSignal): Promise<CommentView[]> {
  const res = await fetch(`/api/runs/${runId}/comments`, { cache: "no-store", signal });
  if (!res.ok) throw new Error(`the comments could not be read (HTTP ${res.status})`);
  return ((await res.json()) as { comments: CommentView[] }).comments;
}

export function useComments(runId: string, initial: CommentView[]) {
  return useQuery({
    queryKey: commentsKey(runId),
    queryFn: ({ signal }) => readComments(runId, signal),
    initialData: initial,
    staleTime: 30_000,
  });
}

function upsert(client: QueryClient, runId: string, c: CommentView) {
  client.setQueryData<CommentView[]>(commentsKey(runId), (list = []) =>
    list.some((x) => x.id === c.id) ? list.map((x) => (x.id === c.id ? c : x)) : [...list, c],
  );
  void client.invalidateQueries({ queryKey: commentsKey(runId) });
}

export type NewComment = { body: string; parentId?: string; frequencyHz?: number; trace?: string | null };

export function usePostComment(runId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: async (input: NewComment): Promise<CommentView> => {
      const res = await fetch(`/api/runs/${runId}/comments`, {
        method: "POST",
        headers: { "Content-Type": "application/json" },
        body: JSON.stringify(input),
      }).catch(() => null);
      if (!res) throw new Error("The comment did not reach the server; your text is still here. Try again.");
      if (!res.ok) throw new Error(await apiErrorMessage(res, `Not saved (${res.status}).`));
      return ((await res.json()) as { comment: CommentView }).comment;
    },
    onSuccess: (c) => upsert(client, runId, c),
  });
}

export function useThreadState(runId: string, commentId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: async (state: ThreadState): Promise<CommentView> => {
      const res = await fetch(`/api/runs/${runId}/comments/${commentId}`, {
        method: "PATCH",
        headers: { "Content-Type": "application/json" },
        body: JSON.stringify({ state }),
      }).catch(() => null);
      if (!res) throw new Error("Could not change the thread. Try again.");
      if (!res.ok) throw new Error(await apiErrorMessage(res, "Could not change the thread. Try again."));
      return ((await res.json()) as { comment: CommentView }).comment;
    },
    onSuccess: (c) => upsert(client, runId, c),
  });
}
