import { Button } from "./button";

export interface ConflictRow {
  label: string;
  yours: string;
  theirs: string;
}

/**
 * A stale save (409): what was saved meanwhile beside what the person typed, which stays in the
 * form. "Save mine over theirs" saves the form again from the version now stored.
 */
export function EditConflict({
  what,
  version,
  rows,
  onOverwrite,
  disabled,
}: {
  what: string;
  version: number;
  rows: ConflictRow[];
  onOverwrite: () => void;
  disabled?: boolean;
}) {
  const differing = rows.filter((r) => r.yours !== r.theirs);
  return (
    <div className="w-full text-sm text-caution-700" data-testid="conflict" role="status">
      <p>
        ▲ Someone saved {what} meanwhile (now version {version}). Your entries are still here;
        nothing was overwritten.
      </p>
      {differing.length ? (
        <table className="mt-2 w-full text-left text-ink-800">
          <thead>
            <tr>
              <th scope="col">Field</th>
              <th scope="col">Yours</th>
              <th scope="col">Theirs (saved)</th>
            </tr>
          </thead>
          <tbody>
            {differing.map((r) => (
              <tr key={r.label}>
                <td>{r.label}</td>
                <td className="figure">{r.yours || "—"}</td>
                <td className="figure">{r.theirs || "—"}</td>
              </tr>
            ))}
          </tbody>
        </table>
      ) : null}
      <p className="mt-2 flex flex-wrap items-center gap-3">
        <Button type="button" variant="secondary" disabled={disabled} onClick={onOverwrite}>
          Save mine over theirs
        </Button>
        <span>or reload the page to take theirs.</span>
      </p>
    </div>
  );
}
