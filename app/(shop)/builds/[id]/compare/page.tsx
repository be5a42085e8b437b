import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";

import { SelectField } from "@/components/ui/field";
import { PageHeader, Signal } from "@/components/ui/status";
import { getBuild, getRevision, listRevisions } from "@/db/queries/builds";
import { unitSystemOf } from "@/db/queries/preferences";
import { requirePageMember } from "@/lib/auth/member";
import { compareKeyFigures, diffInputs } from "@/lib/builds/diff";
import { storedEffectiveInputs } from "@/lib/builds/stored-inputs";
import type { FuelSystemResult } from "@/lib/calc";
import { idOrNotFound } from "@/lib/ids";
import { versionParam } from "@/lib/validations/column-bounds";

export const metadata: Metadata = { title: "Compare revisions" };

const versionOf = (v: string | string[] | undefined) => {
  const parsed = versionParam().safeParse(Array.isArray(v) ? v[0] : v);
  return parsed.success ? parsed.data : null;
};

/** Two revisions of one build side by side: what changed in the inputs and in the key figures. */
export default async function CompareRevisionsPage({
  params,
  searchParams,
}: {
  params: Promise<{ id: string }>;
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const m = await requirePageMember("builds:read");
  const id = idOrNotFound((await params).id);
  const sp = await searchParams;
  const row = await getBuild(m.shopId, id);
  if (!row) notFound();
  const latest = row.build.version;
  const to = versionOf(sp.to) ?? latest;
  const from = versionOf(sp.from) ?? Math.max(1, to - 1);
  const [a, b, revisions, units] = await Promise.all([
    getRevision(m.shopId, id, from),
    getRevision(m.shopId, id, to),
    listRevisions(m.shopId, id),
    unitSystemOf(m.user.id, m.shopId),
  ]);
  // What was sized, each with the shop settings it was sized with: a re-size under new
  // settings shows those settings as the change.
  const changes =
    a && b ? diffInputs(storedEffectiveInputs(a), storedEffectiveInputs(b), units) : [];
  const figures = a && b ? compareKeyFigures(a.result, b.result, units) : [];
  const picker = (name: string, value: number, label: string) => (
    <SelectField label={label} id={`cmp-${name}`} name={name} defaultValue={value}>
      {revisions.map((r) => (
        <option key={r.version} value={r.version}>
          Version {r.version}
          {r.note ? ` — ${r.note}` : ""}
        </option>
      ))}
    </SelectField>
  );
  return (
    <>
      <PageHeader title={`${row.build.title} — compare`}>
        <Link href={`/builds/${id}`} className="text-sm text-copper-700 underline">
          Back to the build
        </Link>
      </PageHeader>
      <form className="mb-6 flex flex-wrap items-end gap-3" action={`/builds/${id}/compare`}>
        {picker("from", from, "From")}
        {picker("to", to, "To")}
        <button
          type="submit"
          className="rounded-md bg-ink-800 px-4 py-2 text-sm font-semibold text-white"
        >
          Compare
        </button>
      </form>
      {!a || !b ? (
        <p role="alert" className="text-danger-700">
          ✕ Version {!a ? from : to} of this build does not exist; pick one from the lists.
        </p>
      ) : (
        <div className="grid gap-6 lg:grid-cols-2">
          <section
            aria-labelledby="cmp-inputs"
            className="rounded-lg border border-ink-200 bg-white p-5"
          >
            <h2 id="cmp-inputs" className="text-lg font-semibold">
              Inputs changed
            </h2>
            {changes.length === 0 ? (
              <p className="mt-2 text-sm text-ink-700">
                The inputs of version {from} and version {to} are the same.
              </p>
            ) : (
              <table className="mt-2 w-full text-left text-sm" data-testid="input-changes">
                <thead className="text-ink-600">
                  <tr>
                    <th scope="col">Field</th>
                    <th scope="col">Version {from}</th>
                    <th scope="col">Version {to}</th>
                  </tr>
                </thead>
                <tbody>
                  {changes.map((c) => (
                    <tr key={c.path} className="border-t border-ink-100">
                      <td className="py-1">{c.label}</td>
                      <td className="figure">{c.before}</td>
                      <td className="figure font-semibold">{c.after}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            )}
          </section>
          <section
            aria-labelledby="cmp-figs"
            className="rounded-lg border border-ink-200 bg-white p-5"
          >
            <h2 id="cmp-figs" className="text-lg font-semibold">
              Key figures
            </h2>
            <table className="mt-2 w-full text-left text-sm" data-testid="figure-changes">
              <thead className="text-ink-600">
                <tr>
                  <th scope="col">Figure</th>
                  <th scope="col">Version {from}</th>
                  <th scope="col">Version {to}</th>
                  <th scope="col">
                    <span className="sr-only">Better or worse</span>
                  </th>
                </tr>
              </thead>
              <tbody>
                {figures.map((f) => (
                  <tr key={f.path} className="border-t border-ink-100" data-verdict={f.verdict}>
                    <td className="py-1">{f.label}</td>
                    <td className="figure">{f.before}</td>
                    <td className="figure font-semibold">{f.after}</td>
                    <td>
                      {f.verdict === "better" ? (
                        <Signal level="ok">better</Signal>
                      ) : f.verdict === "worse" ? (
                        <Signal level="caution">worse</Signal>
                      ) : f.verdict === "changed" ? (
                        <Signal level="info">changed</Signal>
                      ) : null}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </section>
        </div>
      )}
    </>
  );
}
