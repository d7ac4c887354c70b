/**
 * Server start-up hook: check the environment (production refuses to start without NEXTAUTH_SECRET),
 * then pump the e-mail outbox in every Node.js server process.
 */
export async function register(): Promise<void> {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  try {
    await import("@/lib/env");
  } catch (err) {
    console.error(`[phasewright] ${err instanceof Error ? err.message : String(err)}`);
    process.exit(1);
  }
  const { startOutboxPump } = await import("@/lib/mail/outbox");
  startOutboxPump();
}
