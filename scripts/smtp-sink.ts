import { mkdirSync, writeFileSync } from "node:fs";
import path from "node:path";
import { SMTPServer } from "smtp-server";

// Local stand-in for the hosted mail service: accepts every message on loopback, saves it as an
// .eml file in .data/mail (or MAIL_DIR) and logs one line per message. Never relays anything.

const url = new URL(process.env.SMTP_URL || "smtp://127.0.0.1:2526");
const host = url.hostname || "127.0.0.1";
const port = Number(url.port || 2526);
const mailDir = path.resolve(process.env.MAIL_DIR || path.join(__dirname, "..", ".data", "mail"));
mkdirSync(mailDir, { recursive: true });

let counter = 0;

function headerValue(raw: string, name: string): string {
  const head = raw.split(/\r?\n\r?\n/, 1)[0] ?? "";
  const unfolded = head.replace(/\r?\n[ \t]+/g, " ");
  const match = new RegExp(`^${name}:\\s*(.*)$`, "im").exec(unfolded);
  return match?.[1]?.trim() ?? "";
}

const server = new SMTPServer({
  authOptional: true,
  disabledCommands: ["STARTTLS"],
  banner: "Phasewright local mail sink",
  size: 10 * 1024 * 1024,
  onData(stream, session, callback) {
    const chunks: Buffer[] = [];
    stream.on("data", (chunk: Buffer) => chunks.push(chunk));
    stream.on("end", () => {
      const raw = Buffer.concat(chunks).toString("utf8");
      counter += 1;
      const stamp = new Date().toISOString().replace(/[:.]/g, "-");
      const file = path.join(mailDir, `${stamp}-${process.pid}-${counter}.eml`);
      try {
        writeFileSync(file, raw);
      } catch (error) {
        callback(error as Error);
        return;
      }
      const to = session.envelope.rcptTo.map((r) => r.address).join(", ");
      console.log(
        `[mail] to ${to}: ${headerValue(raw, "Subject") || "(no subject)"} -> ${path.basename(file)}`,
      );
      callback();
    });
  },
});

server.on("error", (error: NodeJS.ErrnoException) => {
  console.error(`[mail] ${error.message}`);
  // Another sink already owns the port: say so and leave rather than idle without a socket.
  if (error.code === "EADDRINUSE") process.exit(1);
});
server.listen(port, host, () =>
  console.log(`[mail] sink listening on ${host}:${port}, saving to ${mailDir}`),
);

for (const signal of ["SIGINT", "SIGTERM"] as const) {
  process.on(signal, () => server.close(() => process.exit(0)));
}
