/**
 * Reads one uploaded file from a multipart/form-data request without ever holding more than
 * the allowed size (+ a small allowance for the form's other parts) in memory.
 */
import { HttpError } from './errors';

const FORM_OVERHEAD_BYTES = 64 * 1024;

async function readCapped(body: ReadableStream<Uint8Array>, cap: number, maxBytes: number): Promise<Uint8Array> {
  const reader = body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > cap) {
      await reader.cancel().catch(() => undefined);
      throw new HttpError('PAYLOAD_TOO_LARGE', `The upload is larger than the allowed ${maxBytes} bytes.`);
    }
    chunks.push(value);
  }
  const out = new Uint8Array(total);
  let at = 0;
  for (const c of chunks) {
    out.set(c, at);
    at += c.byteLength;
  }
  return out;
}

export async function readUploadForm(request: Request, maxBytes: number): Promise<{ fileName: string; bytes: Uint8Array; fields: Record<string, string> }> {
  const type = request.headers.get('content-type') ?? '';
  if (!type.toLowerCase().startsWith('multipart/form-data')) throw new HttpError('UNSUPPORTED_MEDIA_TYPE', 'Send the file as multipart/form-data with a "file" field.');
  const cap = maxBytes + FORM_OVERHEAD_BYTES;
  const declared = Number(request.headers.get('content-length') ?? 0);
  if (declared > cap) throw new HttpError('PAYLOAD_TOO_LARGE', `The upload is ${declared} bytes; at most ${maxBytes} are allowed.`);
  if (!request.body) throw new HttpError('BAD_REQUEST', 'The request has no body; attach a file in the "file" field.');
  const raw = await readCapped(request.body, cap, maxBytes);
  let form: FormData;
  try {
    form = await new Response(raw as Uint8Array<ArrayBuffer>, { headers: { 'content-type': type } }).formData();
  } catch {
    throw new HttpError('BAD_REQUEST', 'The multipart form could not be read; attach a file in the "file" field.');
  }
  const file = form.get('file');
  if (!file || typeof file === 'string') throw new HttpError('UNPROCESSABLE_CONTENT', 'Attach the file in the "file" field.', [{ path: ['file'], message: 'missing' }]);
  const fields: Record<string, string> = {};
  for (const [k, v] of form.entries()) if (typeof v === 'string') fields[k] = v;
  const fileName = (file.name || 'upload').split(/[\\/]/).pop()!.slice(0, 200);
  return { fileName, bytes: new Uint8Array(await file.arrayBuffer()), fields };
}
