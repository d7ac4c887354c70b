/**
 * The local stand-in for hosted object storage: `s3rver` on loopback, objects under .data/s3
 * (S3_DATA_DIR). Started by scripts/start.sh (S3_PORT) and scripts/test.sh (E2E_S3_PORT) the way they
 * start the SMTP sink; creates the bucket (S3_BUCKET) so the app finds it. Stops on TERM/INT.
 */
import path from "node:path";
import S3rver from "s3rver";

const port = Number(process.env.S3_PORT ?? "4526");
const bucket = process.env.S3_BUCKET ?? "phasewright-attachments";
const directory = process.env.S3_DATA_DIR ?? path.resolve(".data/s3");

const server = new S3rver({
  address: "127.0.0.1",
  port,
  directory,
  silent: true,
  configureBuckets: [{ name: bucket, configs: [] }],
});

server.run().then(
  (address) =>
    console.log(
      `[s3] object store fake on http://127.0.0.1:${address.port}, bucket ${bucket}, data ${directory}`,
    ),
  (err: unknown) => {
    console.error("[s3] could not start:", err);
    process.exit(1);
  },
);

function stop(): void {
  server.close().finally(() => process.exit(0));
}
process.on("SIGTERM", stop);
process.on("SIGINT", stop);
