"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";

import { Button } from "@/components/ui/button";
import { FormStatus } from "@/components/ui/status";
import { api } from "@/lib/api-client";
import { CSV_COLUMNS } from "@/lib/catalog/flat-part";
import { formatMoney } from "@/lib/catalog/money";

interface PreviewRow {
  line: number;
  sku: string;
  name: string;
  brand: string;
  category: string;
  priceMinor: number;
  stock: number;
  action: "add" | "update" | "unchanged";
}
interface RowError {
  line: number;
  field: string;
  message: string;
}
type Result = {
  preview: PreviewRow[];
  ignoredColumns: string[];
  added?: number;
  updated?: number;
  unchanged?: number;
};

/** Upload → preview (nothing written) → import all rows in one go, or none with every problem listed. */
export function CatalogImport({ currency }: { currency: string }) {
  const router = useRouter();
  const [csv, setCsv] = useState<string | null>(null);
  const [fileName, setFileName] = useState("");
  const [busy, setBusy] = useState<"" | "checking" | "importing">("");
  const [preview, setPreview] = useState<Result | null>(null);
  const [errors, setErrors] = useState<RowError[]>([]);
  const [status, setStatus] = useState<{ ok: boolean; message: string } | null>(null);

  const send = async (text: string, dryRun: boolean) => {
    setBusy(dryRun ? "checking" : "importing");
    setStatus(null);
    const res = await api<Result>(
      "POST",
      `/api/v1/parts/import${dryRun ? "?dryRun=1" : ""}`,
      text,
      { headers: { "content-type": "text/csv", accept: "application/json" } },
    );
    setBusy("");
    if (res.ok) {
      setPreview(res.data);
      setErrors([]);
      if (!dryRun) {
        setStatus({
          ok: true,
          message: `Imported: ${res.data.added} added, ${res.data.updated} updated, ${res.data.unchanged ?? 0} already as in the file`,
        });
        setCsv(null);
        router.refresh();
      }
    } else {
      const b = res.body as { error?: { rows?: RowError[] }; preview?: PreviewRow[] } | null;
      setErrors(b?.error?.rows ?? []);
      setPreview(b?.preview ? { preview: b.preview, ignoredColumns: [] } : null);
      setStatus({ ok: false, message: res.message });
    }
  };

  return (
    <div className="space-y-4">
      <div className="rounded-lg border border-ink-200 bg-white p-5">
        <label htmlFor="csv-file" className="block font-semibold">
          Catalog file (CSV)
        </label>
        <p className="mt-1 text-sm text-ink-600">
          First line: column names. Required: sku, category, brand, name, price, stock. All columns:{" "}
          <span className="figure">{CSV_COLUMNS.join(", ")}</span>. The file&apos;s units are always
          these, whatever units you read the app in (it is a file format; the part form converts):
          kPa, cc/min, L/h, kg/L, ms, A, mm, µm; yes/no for ethanol_ok. pump_curve: one curve per
          voltage, “13.5V 300:340 500:290 | 12V 300:300” (kPa:L/h). dead_time_ms: one row per
          voltage, the same pressures in each, “12V 300:0.85 500:0.95 | 14V 300:0.65 500:0.72”
          (kPa:ms). Known SKUs change only in the columns the file has (a blank cell clears that
          value); a cell our export began with <span className="figure">{"'"}</span> to keep a
          spreadsheet from running it as a formula is read without it.
        </p>
        <input
          id="csv-file"
          type="file"
          accept=".csv,text/csv"
          className="mt-3 block text-sm"
          onChange={async (e) => {
            const f = e.target.files?.[0];
            if (!f) return;
            setFileName(f.name);
            if (f.size > 2 * 1024 * 1024) {
              setStatus({ ok: false, message: "The file is larger than 2 MB" });
              return;
            }
            const text = await f.text();
            setCsv(text);
            await send(text, true);
          }}
        />
        <p aria-live="polite" className="mt-2 text-sm text-ink-700">
          {busy === "checking" ? `Checking ${fileName}…` : busy === "importing" ? "Importing…" : ""}
        </p>
        <FormStatus ok={status?.ok} message={status?.message} />
      </div>
      {errors.length ? (
        <section
          aria-labelledby="imp-errors"
          className="rounded-lg border border-danger-600 bg-white p-5"
        >
          <h2 id="imp-errors" className="font-semibold text-danger-700">
            ✕ Fix these rows, then choose the file again
          </h2>
          <table className="mt-2 w-full text-left text-sm" data-testid="import-errors">
            <thead>
              <tr>
                <th scope="col">Line</th>
                <th scope="col">Column</th>
                <th scope="col">Problem</th>
              </tr>
            </thead>
            <tbody>
              {errors.map((e, i) => (
                <tr key={i} className="border-t border-ink-100">
                  <td className="figure">{e.line}</td>
                  <td className="figure">{e.field}</td>
                  <td>{e.message}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </section>
      ) : null}
      {preview && preview.preview.length ? (
        <section
          aria-labelledby="imp-preview"
          className="rounded-lg border border-ink-200 bg-white p-5"
        >
          <h2 id="imp-preview" className="font-semibold">
            Preview: {preview.preview.length} rows read (
            {preview.preview.filter((r) => r.action === "add").length} new,{" "}
            {preview.preview.filter((r) => r.action === "update").length} updates,{" "}
            {preview.preview.filter((r) => r.action === "unchanged").length} unchanged)
          </h2>
          {preview.ignoredColumns.length ? (
            <p className="text-sm text-caution-700">
              ▲ Columns not used: {preview.ignoredColumns.join(", ")}
            </p>
          ) : null}
          <div className="mt-2 max-h-96 overflow-auto">
            <table className="w-full text-left text-sm">
              <thead>
                <tr>
                  <th scope="col">Line</th>
                  <th scope="col">SKU</th>
                  <th scope="col">Part</th>
                  <th scope="col">Category</th>
                  <th scope="col" className="text-right">
                    Price
                  </th>
                  <th scope="col" className="text-right">
                    Stock
                  </th>
                  <th scope="col">Action</th>
                </tr>
              </thead>
              <tbody>
                {preview.preview.map((r) => (
                  <tr key={r.line} className="border-t border-ink-100">
                    <td className="figure">{r.line}</td>
                    <td className="figure">{r.sku}</td>
                    <td>
                      {r.brand} {r.name}
                    </td>
                    <td>{r.category}</td>
                    <td className="figure text-right">{formatMoney(r.priceMinor, currency)}</td>
                    <td className="figure text-right">{r.stock}</td>
                    <td>{r.action}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          {csv && errors.length === 0 ? (
            <Button className="mt-3" disabled={busy !== ""} onClick={() => send(csv, false)}>
              Import {preview.preview.length} parts
            </Button>
          ) : null}
        </section>
      ) : null}
    </div>
  );
}
