/**
 * S3-compatible object storage for attachments, through the hosted-storage SDK. Endpoint, bucket and
 * credentials come from lib/env.ts; locally that is the `s3rver` fake that `npm start` and `npm test`
 * start (scripts/s3-fake.ts). Objects are private: they are read back only through authorized routes.
 * Any failure to reach the store is a StorageUnavailableError (503); a missing object is a 404.
 */
import {
  CreateBucketCommand,
  DeleteObjectCommand,
  GetObjectCommand,
  HeadBucketCommand,
  PutObjectCommand,
  S3Client,
  S3ServiceException,
} from "@aws-sdk/client-s3";
import { env } from "@/lib/env";
import { NotFoundError, StorageUnavailableError } from "@/lib/errors";

export type StoreConfig = {
  endpoint: string;
  region: string;
  bucket: string;
  accessKeyId: string;
  secretAccessKey: string;
};

const fromEnv = (): StoreConfig => ({
  endpoint: env.S3_ENDPOINT,
  region: env.S3_REGION,
  bucket: env.S3_BUCKET,
  accessKeyId: env.S3_ACCESS_KEY_ID,
  secretAccessKey: env.S3_SECRET_ACCESS_KEY,
});

type Store = { config: StoreConfig; client: S3Client; bucketReady: Promise<void> | null };
const holder = globalThis as unknown as { __phasewrightStore?: Store };

function makeStore(config: StoreConfig): Store {
  const client = new S3Client({
    endpoint: config.endpoint,
    region: config.region,
    forcePathStyle: true,
    credentials: { accessKeyId: config.accessKeyId, secretAccessKey: config.secretAccessKey },
    // A store that is down should answer the user within seconds, not after minutes of retries.
    maxAttempts: 2,
    requestHandler: { connectionTimeout: 2_000, requestTimeout: 15_000 },
  });
  return { config, client, bucketReady: null };
}

function store(): Store {
  holder.__phasewrightStore ??= makeStore(fromEnv());
  return holder.__phasewrightStore;
}

/** Points the store at another endpoint/bucket (tests). Returns the previous configuration. */
export function configureObjectStore(patch: Partial<StoreConfig>): StoreConfig {
  const previous = store().config;
  store().client.destroy();
  holder.__phasewrightStore = makeStore({ ...previous, ...patch });
  return previous;
}

function isMissing(err: unknown): boolean {
  if (!(err instanceof S3ServiceException)) return false;
  return err.name === "NoSuchKey" || err.name === "NotFound" || err.$metadata?.httpStatusCode === 404;
}

/** Anything but "no such object" (refused connection, timeout, 5xx, bad credentials) → 503. */
function unavailable(err: unknown, what: string): StorageUnavailableError {
  const reason = err instanceof Error ? `${err.name}: ${err.message}` : String(err);
  console.error(`[storage] ${what} failed:`, reason);
  return new StorageUnavailableError();
}

/** Creates the bucket once per process when it does not exist yet (the local fake starts empty). */
async function ensureBucket(s: Store): Promise<void> {
  s.bucketReady ??= (async () => {
    try {
      await s.client.send(new HeadBucketCommand({ Bucket: s.config.bucket }));
    } catch (err) {
      if (!isMissing(err)) throw err;
      await s.client.send(new CreateBucketCommand({ Bucket: s.config.bucket }));
    }
  })().catch((err: unknown) => {
    s.bucketReady = null; // try again next time
    throw err;
  });
  return s.bucketReady;
}

/** Stores `body` under `key`. */
export async function putObject(key: string, body: Uint8Array, contentType: string): Promise<void> {
  const s = store();
  try {
    await ensureBucket(s);
    await s.client.send(
      new PutObjectCommand({
        Bucket: s.config.bucket,
        Key: key,
        Body: body,
        ContentType: contentType,
        ContentLength: body.byteLength,
      }),
    );
  } catch (err) {
    throw unavailable(err, `put ${key}`);
  }
}

/** Reads an object whole (attachments are at most a few MB). Missing → NotFoundError. */
export async function getObject(key: string): Promise<{ body: Uint8Array; contentType: string | null }> {
  const s = store();
  try {
    const out = await s.client.send(new GetObjectCommand({ Bucket: s.config.bucket, Key: key }));
    const body = out.Body ? await out.Body.transformToByteArray() : new Uint8Array();
    return { body, contentType: out.ContentType ?? null };
  } catch (err) {
    if (isMissing(err)) throw new NotFoundError("The attachment is no longer in the file store.");
    throw unavailable(err, `get ${key}`);
  }
}

/** Deletes an object; deleting one that is already gone is not an error. */
export async function deleteObject(key: string): Promise<void> {
  const s = store();
  try {
    await s.client.send(new DeleteObjectCommand({ Bucket: s.config.bucket, Key: key }));
  } catch (err) {
    if (isMissing(err)) return;
    throw unavailable(err, `delete ${key}`);
  }
}

/** Does the object exist? (tests and the demo seed) */
export async function objectExists(key: string): Promise<boolean> {
  try {
    await getObject(key);
    return true;
  } catch (err) {
    if (err instanceof NotFoundError) return false;
    throw err;
  }
}
