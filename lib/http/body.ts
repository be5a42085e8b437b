import { Invalid } from "@/lib/domain/errors";

import { HttpError } from "./http-error";
import { controlCharacterIssues } from "./text";

const MAX_BODY_BYTES = 256 * 1024;

/** Reads a JSON body with a size limit; bad JSON or too large → 4xx. */
export async function readJson(req: Request): Promise<unknown> {
  const length = Number(req.headers.get("content-length") ?? "0");
  if (length > MAX_BODY_BYTES)
    throw new HttpError(413, "too_large", `The body is larger than ${MAX_BODY_BYTES / 1024} KiB`);
  const text = await readLimited(req);
  if (!text.trim()) throw new HttpError(400, "empty_body", "Send a JSON body");
  if (!isJsonType(req.headers.get("content-type")))
    throw new HttpError(415, "not_json", "Send the body as JSON (Content-Type: application/json)");
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch {
    throw new HttpError(400, "bad_json", "The body is not valid JSON");
  }
  const issues = controlCharacterIssues(value);
  if (issues.length) throw new Invalid("Some fields carry control characters", issues);
  return value;
}

/** application/json, or a `+json` type, with any parameters. */
export function isJsonType(contentType: string | null): boolean {
  const type = contentType?.split(";")[0]?.trim().toLowerCase() ?? "";
  return type === "application/json" || /^application\/[\w.-]+\+json$/.test(type);
}

/** Reads a text body (a CSV upload) up to `max` bytes; larger → 413, empty → 400. */
export async function readText(req: Request, max: number, what = "file"): Promise<string> {
  const length = Number(req.headers.get("content-length") ?? "0");
  const limitMsg = `The ${what} is larger than ${Math.round(max / 1024 / 1024)} MB`;
  if (length > max) throw new HttpError(413, "too_large", limitMsg);
  const text = await readLimited(req, max, limitMsg);
  if (!text.trim()) throw new HttpError(400, "empty_body", `The ${what} is empty`);
  if (text.includes("\u0000"))
    throw new HttpError(415, "not_text", `The ${what} is not a text (CSV) file`);
  return text;
}

async function readLimited(
  req: Request,
  max = MAX_BODY_BYTES,
  limitMsg = `The body is larger than ${MAX_BODY_BYTES / 1024} KiB`,
): Promise<string> {
  return new TextDecoder().decode(await readBytesLimited(req, max, limitMsg));
}

/** Reads a binary body (an image upload) up to `max` bytes; larger → 413, empty → 400. */
export async function readBytes(req: Request, max: number, what = "file"): Promise<Buffer> {
  const limitMsg = `The ${what} is larger than ${max >= 1024 * 1024 ? `${Math.round(max / 1024 / 1024)} MB` : `${Math.round(max / 1024)} KiB`}`;
  if (Number(req.headers.get("content-length") ?? "0") > max)
    throw new HttpError(413, "too_large", limitMsg);
  const bytes = await readBytesLimited(req, max, limitMsg);
  if (bytes.length === 0) throw new HttpError(400, "empty_body", `The ${what} is empty`);
  return bytes;
}

async function readBytesLimited(req: Request, max: number, limitMsg: string): Promise<Buffer> {
  if (!req.body) return Buffer.alloc(0);
  const reader = req.body.getReader();
  const chunks: Uint8Array[] = [];
  let size = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    size += value.byteLength;
    if (size > max) {
      await reader.cancel();
      throw new HttpError(413, "too_large", limitMsg);
    }
    chunks.push(value);
  }
  return Buffer.concat(chunks);
}
