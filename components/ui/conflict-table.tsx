/** One field of a stale save: what the person typed beside what was saved meanwhile. */
export interface ConflictRow {
  /** Tells rows apart where two fields share a label (the build's feed and return lines); the label when left out. */
  key?: string;
  label: string;
  yours: string;
  theirs: string;
}

/**
 * The one "Field / Yours / Theirs (saved)" table of a stale save (409), for every editor that
 * shows one: the customer, part and supplier forms (`EditConflict`) and the build sheet, whose
 * rows follow the form as it is typed in. Only the fields that differ; an empty value reads "—".
 * Nothing when no field differs.
 */
export function ConflictTable({ rows }: { rows: ConflictRow[] }) {
  const differing = rows.filter((r) => r.yours !== r.theirs);
  if (differing.length === 0) return null;
  return (
    <table className="mt-2 w-full text-left text-ink-800" data-testid="conflict-table">
      <thead>
        <tr>
          <th scope="col">Field</th>
          <th scope="col">Yours</th>
          <th scope="col">Theirs (saved)</th>
        </tr>
      </thead>
      <tbody>
        {differing.map((r) => (
          <tr key={r.key ?? r.label}>
            <td>{r.label}</td>
            <td className="figure">{r.yours || "—"}</td>
            <td className="figure">{r.theirs || "—"}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
