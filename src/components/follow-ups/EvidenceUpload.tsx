/** Add an evidence file (PDF, PNG or JPEG) to a follow-up task; the server checks type by content and size, and its message is shown as it is. */
import { useState } from 'react';
import { ApiError } from '../ui/api-client';
import { uploadWithProgress } from '../uploads/upload-request';

export function EvidenceUpload({ taskId }: { taskId: number }) {
  const [file, setFile] = useState<File | null>(null);
  const [busy, setBusy] = useState(false);
  const [problem, setProblem] = useState<string | null>(null);
  const id = `evidence-file-${taskId}`;

  async function send(e: React.FormEvent) {
    e.preventDefault();
    if (!file) return setProblem('Choose a file first.');
    const form = new FormData();
    form.append('file', file);
    setBusy(true);
    setProblem(null);
    try {
      await uploadWithProgress(
        `/api/follow-ups/${taskId}/evidence`,
        form,
        () => undefined,
        () => undefined,
      );
      const back = new URLSearchParams(window.location.search);
      back.delete('saved');
      back.set('added', String(taskId));
      window.location.assign(`/follow-ups?${back}#task-${taskId}`);
    } catch (err) {
      setProblem(err instanceof ApiError ? err.message : 'The file could not be added.');
      setBusy(false);
    }
  }
  return (
    <form className="flex flex-col gap-2" onSubmit={(e) => void send(e)}>
      <label className="field" htmlFor={id}>
        <span>Add evidence (PDF, PNG or JPEG: a photo of the site, an inspection report)</span>
        <input
          id={id}
          type="file"
          className="input"
          accept="application/pdf,image/png,image/jpeg"
          onChange={(e) => setFile(e.target.files?.[0] ?? null)}
        />
      </label>
      <button className="btn btn-quiet self-start" type="submit" disabled={busy || !file}>
        {busy ? 'Adding…' : 'Add evidence'}
      </button>
      {problem && (
        <p className="notice notice-warn" role="alert">
          ⚠ {problem}
        </p>
      )}
    </form>
  );
}
