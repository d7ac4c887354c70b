/** Server start-up hook: pump the e-mail outbox in every Node.js server process. */
export async function register(): Promise<void> {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  const { startOutboxPump } = await import("@/lib/mail/outbox");
  startOutboxPump();
}
