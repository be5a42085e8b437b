import "server-only";

import type { NoticeKind } from "@/lib/domain/operations";

type Attachment = { filename: string; content: Buffer; contentType: string };
/** Files a notice carries, made when it is sent (and made again on a retry). */
export type AttachmentMaker = () => Promise<Attachment[]>;

/** The files of a notice kind, from its record; none for most notices. */
export function noticeFiles(
  _kind: NoticeKind,
  _shopId: string,
  _recordId: string,
): AttachmentMaker | undefined {
  return undefined;
}
