#!/usr/bin/env node
/** Local S3-compatible store (s3rver) for uploads: S3_PORT, S3_DIR; the bucket is made at start. */
import S3rver from "s3rver";

const port = Number(process.env.S3_PORT ?? 4569);
const bucket = process.env.S3_BUCKET ?? "fuelwright-uploads";
const server = new S3rver({
  port,
  address: "127.0.0.1",
  silent: true,
  directory: process.env.S3_DIR ?? ".data/s3",
  configureBuckets: [{ name: bucket }],
});
await server.run();
console.log(`S3 fake on http://127.0.0.1:${port} (bucket ${bucket})`);
