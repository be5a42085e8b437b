import { Button } from "./button";
import { ConflictTable, type ConflictRow } from "./conflict-table";

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
  return (
    <div className="w-full text-sm text-caution-700" data-testid="conflict" role="status">
      <p>
        ▲ Someone saved {what} meanwhile (now version {version}). Your entries are still here;
        nothing was overwritten.
      </p>
      <ConflictTable rows={rows} />
      <p className="mt-2 flex flex-wrap items-center gap-3">
        <Button type="button" variant="secondary" disabled={disabled} onClick={onOverwrite}>
          Save mine over theirs
        </Button>
        <span>or reload the page to take theirs.</span>
      </p>
    </div>
  );
}
