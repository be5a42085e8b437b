import { describe, expect, it } from "vitest";

import { BASE_URL, getBytes, request } from "../helpers/http";

const PNG_SIGNATURE = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);

/** Width and height from a PNG's IHDR chunk (PNG spec, section 11.2.2). */
const pngSize = (b: Buffer) => [b.readUInt32BE(16), b.readUInt32BE(20)];

// Signed out on purpose: browsers fetch icons and the manifest without the session cookie.
describe("icons and the web app manifest", () => {
  it("favicon.ico is an ICO of PNG images", async () => {
    const r = await getBytes(null, "/favicon.ico");
    expect(r.status).toBe(200);
    expect(r.headers.get("content-type")).toMatch(/^image\/(x-icon|vnd\.microsoft\.icon)/);
    // ICONDIR: reserved 0, type 1 (icon), then the number of images (ICO format, Microsoft docs).
    expect(r.bytes.readUInt16LE(0)).toBe(0);
    expect(r.bytes.readUInt16LE(2)).toBe(1);
    const count = r.bytes.readUInt16LE(4);
    expect(count).toBeGreaterThanOrEqual(2);
    for (let i = 0; i < count; i++) {
      const offset = r.bytes.readUInt32LE(6 + 16 * i + 12);
      expect(r.bytes.subarray(offset, offset + 8).equals(PNG_SIGNATURE)).toBe(true);
    }
  });

  it.each([
    ["/icon-192.png", 192],
    ["/icon-512.png", 512],
    ["/apple-touch-icon.png", 180],
  ])("%s is a %d px PNG", async (path, size) => {
    const r = await getBytes(null, path);
    expect(r.status).toBe(200);
    expect(r.headers.get("content-type")).toBe("image/png");
    expect(r.bytes.subarray(0, 8).equals(PNG_SIGNATURE)).toBe(true);
    expect(pngSize(r.bytes)).toEqual([size, size]);
  });

  it("icon.svg is SVG", async () => {
    const r = await request(null, "GET", "/icon.svg");
    expect(r.status).toBe(200);
    expect(r.headers.get("content-type")).toMatch(/^image\/svg\+xml/);
    expect(r.text).toContain("<svg");
  });

  it("the manifest names the app and lists icons that answer", async () => {
    const r = await request(null, "GET", "/manifest.webmanifest");
    expect(r.status).toBe(200);
    expect(r.headers.get("content-type")).toMatch(/^application\/manifest\+json/);
    expect(r.json.name).toBe("Fuelwright");
    expect(r.json.theme_color).toMatch(/^#[0-9a-f]{6}$/);
    for (const icon of r.json.icons as { src: string }[])
      expect((await getBytes(null, icon.src)).status, icon.src).toBe(200);
  });

  it("every page links the icons and the manifest", async () => {
    const html = await (await fetch(`${BASE_URL}/sign-in`)).text();
    expect(html).toContain('rel="manifest" href="/manifest.webmanifest"');
    expect(html).toMatch(/rel="icon" href="\/favicon.ico"/);
    expect(html).toMatch(/rel="icon" href="\/icon.svg"/);
    expect(html).toMatch(/rel="apple-touch-icon" href="\/apple-touch-icon.png"/);
  });
});
