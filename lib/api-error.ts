/**
 * The API's error answer (`{error: {message, details: {fields}}}`, lib/api.ts) as one sentence for a
 * client: the named field's first message, else the first field message, else the message, else the
 * fallback. Client-safe.
 */
export async function apiErrorMessage(res: Response, fallback: string, field?: string): Promise<string> {
  const data = (await res.json().catch(() => null)) as {
    error?: { message?: string; details?: { fields?: Record<string, string[]> } };
  } | null;
  const fields = data?.error?.details?.fields;
  const fromField = fields ? (field ? fields[field]?.[0] : Object.values(fields)[0]?.[0]) : undefined;
  return fromField ?? data?.error?.message ?? fallback;
}
