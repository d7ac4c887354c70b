/** Only same-site paths may be a post-sign-in destination ("/projects", not "https://elsewhere"). */
export function safeCallback(value: string | null | undefined, fallback = "/projects"): string {
  if (!value?.startsWith("/") || value.startsWith("//") || value.startsWith("/\\")) return fallback;
  return value;
}
