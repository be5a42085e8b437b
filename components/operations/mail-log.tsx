import { ActionButton } from "@/components/operations/action-button";
import { LocalTime } from "@/components/ui/local-time";
import { Signal } from "@/components/ui/status";
import type { MailLogRow } from "@/db/schema";
import { NOTICE_LABELS } from "@/lib/domain/operations";
import { retryNoticeAction } from "@/lib/notices/notice-actions";

/** The e-mails logged on a record: to whom, what, sent or failed (a failed one can be sent again). */
export function MailLog({ rows }: { rows: MailLogRow[] }) {
  if (rows.length === 0)
    return <p className="text-sm text-ink-600">No e-mail has been sent about this yet.</p>;
  return (
    <ul className="divide-y divide-ink-100 rounded-lg border border-ink-200 bg-white text-sm">
      {rows.map((r) => (
        <li key={r.id} className="flex flex-wrap items-center justify-between gap-3 px-4 py-2">
          <div className="min-w-0">
            <p className="font-medium text-ink-800">{NOTICE_LABELS[r.notice]}</p>
            <p className="break-all text-ink-600">
              to {r.to} · <LocalTime value={r.sentAt ?? r.createdAt} />
            </p>
            {r.status === "failed" && r.error ? (
              <p className="text-danger-700">Not sent: {r.error}</p>
            ) : null}
          </div>
          {r.status === "sent" ? (
            <Signal level="ok">Sent</Signal>
          ) : r.status === "failed" ? (
            <ActionButton
              action={retryNoticeAction}
              payload={{ id: r.id }}
              label="Send again"
              variant="secondary"
            />
          ) : (
            <Signal level="info">Sending</Signal>
          )}
        </li>
      ))}
    </ul>
  );
}
