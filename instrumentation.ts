/**
 * Server start-up hook: check the environment (production refuses to start without NEXTAUTH_SECRET),
 * stamp each request with its TCP peer address (lib/peer-address.ts), then pump the e-mail outbox in
 * every Node.js server process.
 */
export async function register(): Promise<void> {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  let trustProxy = false;
  try {
    trustProxy = (await import("@/lib/env")).env.TRUST_PROXY;
  } catch (err) {
    console.error(`[phasewright] ${err instanceof Error ? err.message : String(err)}`);
    process.exit(1);
  }
  const { installPeerAddressStamp } = await import("@/lib/peer-address");
  installPeerAddressStamp(trustProxy);
  const { startOutboxPump } = await import("@/lib/mail/outbox");
  startOutboxPump();
}
