import "server-only";

import { createHash } from "node:crypto";

import { LRUCache } from "lru-cache";
import pLimit from "p-limit";

import { HttpError } from "@/lib/http/http-error";

/**
 * PDF rendering is CPU-bound (~100–200 ms a sheet) and runs on the request's event loop. Three
 * guards keep it from starving every other request:
 * - a sheet is rendered once per distinct content (the hash of its data) and kept in a
 *   size-bounded LRU, so repeated downloads of a revision cost a hash, not a render;
 * - requests for a sheet already being rendered wait for that one render;
 * - renders run one at a time, first come first served, and when the queue is longer than
 *   a few seconds' work the request gets 503 + Retry-After instead of a timeout.
 * Per process: several instances each keep their own (docs/architecture.md §5 has the queue).
 */
export const PDF_CACHE_BYTES = 64 * 1024 * 1024;
export const PDF_QUEUE_LIMIT = 24;

const cache = new LRUCache<string, Buffer>({
  maxSize: PDF_CACHE_BYTES,
  sizeCalculation: (b) => Math.max(1, b.length),
});
const inFlight = new Map<string, Promise<Buffer>>();
const renders = pLimit(1);

export class RenderBusyError extends HttpError {
  constructor() {
    super(503, "busy", "Many documents are being prepared right now; try again in a few seconds");
  }
}

/** The content key of a document: its kind and the sha-256 of its data. */
export function pdfKey(kind: string, data: unknown): string {
  return `${kind}:${sha256(JSON.stringify(digestable(data)))}`;
}

const sha256 = (x: string | Uint8Array) => createHash("sha256").update(x).digest("base64url");

/** The data with every byte array (a logo) replaced by its hash, so the key costs no byte-by-byte JSON. */
function digestable(v: unknown): unknown {
  if (v instanceof Uint8Array) return `bytes:${sha256(v)}`;
  if (v instanceof Date) return v.toISOString();
  if (Array.isArray(v)) return v.map(digestable);
  if (v && typeof v === "object")
    return Object.fromEntries(Object.entries(v).map(([k, x]) => [k, digestable(x)]));
  return v;
}

/** The PDF for `data`: from the cache, from a render already running, or rendered now. */
export async function cachedPdf<T>(
  kind: string,
  data: T,
  render: (data: T) => Promise<Buffer>,
): Promise<Buffer> {
  const key = pdfKey(kind, data);
  const hit = cache.get(key);
  if (hit) return hit;
  const running = inFlight.get(key);
  if (running) return running;
  if (renders.pendingCount >= PDF_QUEUE_LIMIT) throw new RenderBusyError();
  const job = renders(() => render(data))
    .then((pdf) => {
      cache.set(key, pdf);
      return pdf;
    })
    .finally(() => inFlight.delete(key));
  inFlight.set(key, job);
  return job;
}

/** For tests: how full the cache is and how many renders wait. */
export function pdfCacheStats() {
  return {
    entries: cache.size,
    bytes: cache.calculatedSize,
    queued: renders.pendingCount,
    rendering: renders.activeCount,
  };
}

/** For tests: forget every cached sheet. */
export function clearPdfCache() {
  cache.clear();
}
