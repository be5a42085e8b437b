import "server-only";

import {
  DeleteObjectCommand,
  GetObjectCommand,
  PutObjectCommand,
  S3Client,
} from "@aws-sdk/client-s3";

import { NotFound, Unavailable } from "@/lib/domain/errors";
import { serverEnv } from "@/lib/env";

let client: S3Client | undefined;

/** The AWS S3 SDK, pointed at S3_ENDPOINT (the local fake by default). */
function s3(): S3Client {
  const env = serverEnv();
  client ??= new S3Client({
    endpoint: env.S3_ENDPOINT,
    region: env.S3_REGION,
    forcePathStyle: true,
    credentials: { accessKeyId: env.S3_ACCESS_KEY_ID, secretAccessKey: env.S3_SECRET_ACCESS_KEY },
  });
  return client;
}

/**
 * Runs a storage call: an object that is not there (S3's NoSuchKey, or a 404) is "not found";
 * any other failure is the storage being away (503, nothing stored).
 */
async function storage<T>(call: () => Promise<T>): Promise<T> {
  try {
    return await call();
  } catch (e) {
    if (isMissingObject(e)) throw new NotFound("The stored file");
    console.error("object storage:", (e as Error).message);
    throw new Unavailable(
      "File storage is not answering; nothing was stored. Try again in a moment.",
      "storage_unavailable",
      "self",
    );
  }
}

export async function putObject(key: string, body: Buffer, contentType: string) {
  await storage(() =>
    s3().send(
      new PutObjectCommand({
        Bucket: serverEnv().S3_BUCKET,
        Key: key,
        Body: body,
        ContentType: contentType,
      }),
    ),
  );
}

/** Removes a stored file; one already gone is fine. */
export async function deleteObject(key: string) {
  try {
    await storage(() =>
      s3().send(new DeleteObjectCommand({ Bucket: serverEnv().S3_BUCKET, Key: key })),
    );
  } catch (e) {
    if (!(e instanceof NotFound)) throw e;
  }
}

export async function getObject(key: string): Promise<Buffer> {
  return storage(async () => {
    const r = await s3().send(new GetObjectCommand({ Bucket: serverEnv().S3_BUCKET, Key: key }));
    return Buffer.from(await r.Body!.transformToByteArray());
  });
}

/** The SDK's answer for an object that is not in the bucket. */
function isMissingObject(e: unknown): boolean {
  const err = e as { name?: unknown; Code?: unknown; $metadata?: { httpStatusCode?: unknown } };
  return (
    err?.name === "NoSuchKey" || err?.Code === "NoSuchKey" || err?.$metadata?.httpStatusCode === 404
  );
}
