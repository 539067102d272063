/**
 * Documents people attach (proposal attachments, follow-up evidence): the size limit and the type
 * checked by content before any transaction, then the row with its SHA-256 and the audit entry.
 */
import { createHash, randomUUID } from 'node:crypto';
import { recordAudit } from '../db/audit';
import type { Db } from '../db/client';
import { getProposalSettings } from '../db/proposals';
import { HttpError } from '../http/errors';
import type { Caller } from '../http/handle';
import { detectAttachmentType, type AttachmentType } from '../proposals/file-type';

export type IncomingFile = { fileName: string; bytes: Uint8Array };
export type StoredDocument = {
  id: string;
  fileName: string;
  mediaType: AttachmentType;
  sizeBytes: number;
  sha256: string;
  uploadedBy: string;
  uploadedAt: string;
};

/**
 * Refuses a file over `proposal.attachment-max-bytes` (413) or that is not PDF, PNG or JPEG by
 * its content (415); returns its media type. `words` names the files and the verb in messages.
 */
export async function checkDocument(
  conn: Db,
  file: IncomingFile,
  words: { plural: string; added: string; add: string },
): Promise<AttachmentType> {
  const max = (await getProposalSettings(conn))['proposal.attachment-max-bytes'];
  if (file.bytes.length > max)
    throw new HttpError(
      'PAYLOAD_TOO_LARGE',
      `"${file.fileName}" is ${file.bytes.length.toLocaleString('en')} bytes; ${words.plural} may be at most ${max.toLocaleString('en')} bytes.`,
    );
  const kind = detectAttachmentType(file.bytes);
  if ('problem' in kind)
    throw new HttpError(
      'UNSUPPORTED_MEDIA_TYPE',
      `"${file.fileName}" was not ${words.added}: ${kind.problem} ${words.add} PDF, PNG or JPEG files.`,
    );
  return kind.type;
}

/** Stores a checked file through `insert` and audits it, in the caller's transaction. */
export async function storeDocument(
  trx: Db,
  by: Caller,
  file: IncomingFile,
  mediaType: AttachmentType,
  insert: (row: {
    id: string;
    fileName: string;
    mediaType: AttachmentType;
    bytes: Uint8Array;
    sha256: string;
  }) => Promise<void>,
  audit: { action: string; entityType: string; entityId: string; details: (id: string) => Record<string, unknown> },
): Promise<StoredDocument> {
  const id = randomUUID();
  const sha256 = createHash('sha256').update(file.bytes).digest('hex');
  await insert({ id, fileName: file.fileName, mediaType, bytes: file.bytes, sha256 });
  await recordAudit(trx, {
    actorId: by.id,
    action: audit.action,
    entityType: audit.entityType,
    entityId: audit.entityId,
    details: { ...audit.details(id), fileName: file.fileName, sha256, sizeBytes: file.bytes.length },
  });
  return {
    id,
    fileName: file.fileName,
    mediaType,
    sizeBytes: file.bytes.length,
    sha256,
    uploadedBy: by.name,
    uploadedAt: new Date().toISOString(),
  };
}
