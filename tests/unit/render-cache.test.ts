import { describe, expect, it, vi } from "vitest";

vi.mock("server-only", () => ({}));
const { PDF_QUEUE_LIMIT, RenderBusyError, cachedPdf, clearPdfCache, pdfCacheStats, pdfKey } =
  await import("@/lib/pdf/render-cache");

const deferred = () => {
  let resolve!: (b: Buffer) => void;
  const promise = new Promise<Buffer>((r) => (resolve = r));
  return { promise, resolve };
};

describe("PDF render cache (common practice, no source)", () => {
  it("keys by content: same data same key, any change or another logo a new key", () => {
    const a = {
      build: { title: "A", savedAt: new Date("2026-12-01T00:00:00Z") },
      shop: { logo: { data: Buffer.from([1, 2, 3]) } },
    };
    expect(pdfKey("spec-sheet", a)).toBe(
      pdfKey(
        "spec-sheet",
        structuredClone({ ...a, shop: { logo: { data: Buffer.from([1, 2, 3]) } } }),
      ),
    );
    expect(pdfKey("spec-sheet", { ...a, build: { ...a.build, title: "B" } })).not.toBe(
      pdfKey("spec-sheet", a),
    );
    expect(
      pdfKey("spec-sheet", { ...a, shop: { logo: { data: Buffer.from([1, 2, 4]) } } }),
    ).not.toBe(pdfKey("spec-sheet", a));
    expect(pdfKey("quote-sheet", a)).not.toBe(pdfKey("spec-sheet", a));
  });

  it("renders a sheet once: a repeat is served from the cache, concurrent asks share one render", async () => {
    clearPdfCache();
    const render = vi.fn(async (d: { n: number }) => Buffer.from(`pdf ${d.n}`));
    const [x, y] = await Promise.all([
      cachedPdf("t", { n: 1 }, render),
      cachedPdf("t", { n: 1 }, render),
    ]);
    const z = await cachedPdf("t", { n: 1 }, render);
    expect(render).toHaveBeenCalledTimes(1);
    expect([x, y, z].map(String)).toEqual(["pdf 1", "pdf 1", "pdf 1"]);
    await cachedPdf("t", { n: 2 }, render);
    expect(render).toHaveBeenCalledTimes(2);
    expect(pdfCacheStats().entries).toBe(2);
  });

  it("renders one at a time, and answers busy (503) past the queue limit without losing the queued ones", async () => {
    clearPdfCache();
    const gates = Array.from({ length: PDF_QUEUE_LIMIT + 1 }, deferred);
    let running = 0;
    let most = 0;
    const render = async (d: { n: number }) => {
      running++;
      most = Math.max(most, running);
      const b = await gates[d.n]!.promise;
      running--;
      return b;
    };
    // One running, PDF_QUEUE_LIMIT waiting: the next distinct sheet is refused.
    const jobs = gates.map((_, n) => cachedPdf("q", { n }, render));
    await Promise.resolve();
    const refused = cachedPdf("q", { n: 999 }, render);
    await expect(refused).rejects.toBeInstanceOf(RenderBusyError);
    await expect(refused).rejects.toMatchObject({ status: 503, code: "busy" });
    gates.forEach((g, n) => g.resolve(Buffer.from(`sheet ${n}`)));
    const done = await Promise.all(jobs);
    expect(done.map(String)).toEqual(gates.map((_, n) => `sheet ${n}`));
    expect(most).toBe(1);
  });

  it("a failed render is not cached: the next ask renders again", async () => {
    clearPdfCache();
    let calls = 0;
    const render = async () => {
      calls++;
      if (calls === 1) throw new Error("font missing");
      return Buffer.from("ok");
    };
    await expect(cachedPdf("f", { n: 1 }, render)).rejects.toThrow("font missing");
    expect(String(await cachedPdf("f", { n: 1 }, render))).toBe("ok");
    expect(calls).toBe(2);
  });
});
