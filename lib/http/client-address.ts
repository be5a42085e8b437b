import { isIP } from "node:net";

/**
 * The client's address, as the rate limits count it. The server itself writes it into this
 * request header (replacing anything a client sent under that name) before the app sees the
 * request; better-auth and the app's own limits read it from there and from nowhere else.
 */
export const CLIENT_ADDRESS_HEADER = "x-fuelwright-client-address";

type HeaderBag = Record<string, string | string[] | undefined>;

/** One address in the form the limits count: IPv4 as is (also when mapped into IPv6), IPv6 lower case. */
export function normalizeAddress(raw: string | undefined | null): string | null {
  const a = (raw ?? "").trim().replace(/^\[(.*)\]$/, "$1");
  const v = isIP(a);
  if (v === 4) return a;
  if (v !== 6) return null;
  const mapped = /^::ffff:(\d+\.\d+\.\d+\.\d+)$/i.exec(a);
  return mapped ? mapped[1]! : a.toLowerCase();
}

/**
 * Who the client is. Without a trusted proxy (the default) it is the socket's peer and every
 * forwarding header is ignored, so a client cannot name itself. With `trustedHeader` set (the
 * app stands behind a proxy that writes that header), it is the last address in that header —
 * the one the nearest proxy wrote; whatever a client put before it is not believed — or the
 * peer when the header is missing or not an address.
 */
export function clientAddressOf(
  peer: string | undefined,
  headers: HeaderBag,
  trustedHeader: string,
): string {
  const fallback = normalizeAddress(peer) ?? "unknown";
  if (!trustedHeader) return fallback;
  const raw = headers[trustedHeader];
  const value = Array.isArray(raw) ? raw.join(",") : raw;
  const last = value?.split(",").pop();
  return normalizeAddress(last) ?? fallback;
}

const INSTALLED = Symbol.for("fuelwright.client-address");

/**
 * Makes the Node server write CLIENT_ADDRESS_HEADER on every request it receives from now on
 * (called once at boot from instrumentation.ts). Next.js hands route handlers, server actions
 * and better-auth a request without its socket, so the address is taken here, where the socket
 * is still at hand.
 */
export async function installClientAddress(trustedHeader: string): Promise<void> {
  const g = globalThis as { [INSTALLED]?: boolean };
  if (g[INSTALLED]) return;
  g[INSTALLED] = true;
  const http = await import("node:http");
  const emit = http.Server.prototype.emit as (
    event: string | symbol,
    ...args: unknown[]
  ) => boolean;
  http.Server.prototype.emit = function (
    this: unknown,
    event: string | symbol,
    ...args: unknown[]
  ) {
    if (event === "request") {
      const req = args[0] as { headers: HeaderBag; socket?: { remoteAddress?: string } };
      req.headers[CLIENT_ADDRESS_HEADER] = clientAddressOf(
        req.socket?.remoteAddress,
        req.headers,
        trustedHeader,
      );
    }
    return emit.call(this, event, ...args);
  } as typeof http.Server.prototype.emit;
}
