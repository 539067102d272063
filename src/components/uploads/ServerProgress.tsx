/** What the server is doing with an upload, as stored in the database: words, a bar when counted, when it started. */
import { formatDateTime } from '~/lib/format/dates';
import { phaseWords, shareDone } from './progress-words';
import type { UploadStatus } from './types';

export function ServerProgress({ status }: { status: UploadStatus }) {
  const share = shareDone(status);
  const words = phaseWords(status, status.purpose);
  return (
    <div className="flex flex-col gap-1" role="status" aria-live="polite">
      <p className="font-medium">
        <span aria-hidden="true">◐ </span>
        {words}
      </p>
      <progress
        className="h-2 w-full max-w-md accent-sward-700"
        aria-label={words}
        max={1}
        {...(share !== null ? { value: share } : {})}
      />
      <p className="text-sm text-muted">
        “{status.fileName}”: started {formatDateTime(status.startedAt)}. You may leave or reload this page; the work
        goes on and this page picks it up again.
      </p>
    </div>
  );
}
