/** Attach a PDF, PNG or JPEG to a proposal; the server checks the type by content and the size, and its message is shown as it is. */
import { useState } from 'react';
import { ApiError } from '../ui/api-client';
import { uploadWithProgress } from '../uploads/upload-request';

export function AttachmentUpload({ proposalId }: { proposalId: number }) {
  const [file, setFile] = useState<File | null>(null);
  const [busy, setBusy] = useState(false);
  const [note, setNote] = useState<{ ok: boolean; text: string } | null>(null);

  async function send(e: React.FormEvent) {
    e.preventDefault();
    if (!file) return setNote({ ok: false, text: 'Choose a file first.' });
    const form = new FormData();
    form.append('file', file);
    setBusy(true);
    setNote(null);
    try {
      await uploadWithProgress(
        `/api/proposals/${proposalId}/attachments`,
        form,
        () => undefined,
        () => undefined,
      );
      window.location.reload();
    } catch (err) {
      setNote({ ok: false, text: err instanceof ApiError ? err.message : 'The file could not be attached.' });
      setBusy(false);
    }
  }
  return (
    <form className="mt-3 flex flex-col gap-2" onSubmit={(e) => void send(e)}>
      <label className="field" htmlFor="attachment-file">
        <span>Attach a document (PDF, PNG or JPEG)</span>
        <input
          id="attachment-file"
          type="file"
          className="input"
          accept="application/pdf,image/png,image/jpeg"
          onChange={(e) => setFile(e.target.files?.[0] ?? null)}
        />
      </label>
      <button className="btn btn-quiet self-start" type="submit" disabled={busy || !file}>
        {busy ? 'Attaching…' : 'Attach'}
      </button>
      {note && (
        <p className={note.ok ? 'notice' : 'notice notice-warn'} role="alert">
          {note.ok ? '✓ ' : '⚠ '}
          {note.text}
        </p>
      )}
    </form>
  );
}
