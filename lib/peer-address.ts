import http from "node:http";
import https from "node:https";
import { PEER_HEADER } from "@/lib/rate-limit";

let installed = false;

/** Rewrites one incoming request's headers: PEER_HEADER = the socket's address; without a trusted proxy, X-Forwarded-For too. */
export function stampPeer(req: http.IncomingMessage, trustProxy: boolean): void {
  const peer = req.socket?.remoteAddress ?? "";
  req.headers[PEER_HEADER] = peer;
  // Next.js fills X-Forwarded-For from the socket only when absent; a client's own value would stay.
  if (!trustProxy) req.headers["x-forwarded-for"] = peer;
}

/**
 * Route handlers never see the TCP socket, so every Node HTTP server in this process stamps the peer
 * address on each request before Next.js handles it (called from instrumentation.ts at start-up).
 * Idempotent.
 */
export function installPeerAddressStamp(trustProxy: boolean): void {
  if (installed) return;
  installed = true;
  for (const proto of [http.Server.prototype, https.Server.prototype]) {
    const original = proto.emit as (this: http.Server, event: string | symbol, ...args: unknown[]) => boolean;
    proto.emit = function emit(this: http.Server, event: string | symbol, ...args: unknown[]) {
      if (event === "request") stampPeer(args[0] as http.IncomingMessage, trustProxy);
      return original.call(this, event, ...args);
    } as typeof proto.emit;
  }
}
