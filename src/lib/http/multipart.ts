/**
 * Reads one uploaded file from a multipart/form-data request, streaming through busboy: the
 * request is never held whole in memory beyond the allowed size (+ a small allowance for the
 * form's other parts), and the parsing goes chunk by chunk, so other requests keep flowing while
 * a large file arrives.
 */
import { Readable } from 'node:stream';
import busboy from 'busboy';
import { HttpError } from './errors';

const FORM_OVERHEAD_BYTES = 64 * 1024;
const unreadable = () =>
  new HttpError('BAD_REQUEST', 'The multipart form could not be read; attach a file in the "file" field.');
const tooLarge = (maxBytes: number) =>
  new HttpError('PAYLOAD_TOO_LARGE', `The upload is larger than the allowed ${maxBytes} bytes.`);

export async function readUploadForm(
  request: Request,
  maxBytes: number,
): Promise<{ fileName: string; bytes: Uint8Array; fields: Record<string, string> }> {
  const type = request.headers.get('content-type') ?? '';
  if (!type.toLowerCase().startsWith('multipart/form-data'))
    throw new HttpError('UNSUPPORTED_MEDIA_TYPE', 'Send the file as multipart/form-data with a "file" field.');
  const cap = maxBytes + FORM_OVERHEAD_BYTES;
  const declared = Number(request.headers.get('content-length') ?? 0);
  if (declared > cap)
    throw new HttpError('PAYLOAD_TOO_LARGE', `The upload is ${declared} bytes; at most ${maxBytes} are allowed.`);
  if (!request.body) throw new HttpError('BAD_REQUEST', 'The request has no body; attach a file in the "file" field.');
  let parser: busboy.Busboy;
  try {
    parser = busboy({
      headers: { 'content-type': type },
      limits: { files: 1, fileSize: maxBytes, fields: 50, fieldSize: FORM_OVERHEAD_BYTES, parts: 60 },
    });
  } catch {
    throw unreadable();
  }
  const source = Readable.fromWeb(request.body as import('node:stream/web').ReadableStream<Uint8Array>);
  return new Promise((resolve, reject) => {
    const fields: Record<string, string> = {};
    let file: { fileName: string; chunks: Buffer[]; size: number; truncated: boolean } | null = null;
    let settled = false;
    const fail = (e: HttpError) => {
      if (settled) return;
      settled = true;
      source.unpipe(parser);
      source.destroy();
      reject(e);
    };
    let received = 0;
    source.on('data', (chunk: Buffer) => {
      received += chunk.length;
      if (received > cap) fail(tooLarge(maxBytes));
    });
    source.on('error', () => fail(unreadable()));
    parser.on('file', (name, stream, info) => {
      if (name !== 'file' || file) return void stream.resume();
      const f = { fileName: info.filename ?? '', chunks: [] as Buffer[], size: 0, truncated: false };
      file = f;
      stream.on('data', (d: Buffer) => (f.chunks.push(d), (f.size += d.length)));
      stream.on('limit', () => (f.truncated = true));
    });
    parser.on('field', (name, value) => (fields[name] = value));
    parser.on('error', () => fail(unreadable()));
    parser.on('close', () => {
      if (settled) return;
      const f = file as { fileName: string; chunks: Buffer[]; size: number; truncated: boolean } | null;
      if (f?.truncated) return fail(tooLarge(maxBytes));
      if (!f)
        return fail(
          new HttpError('UNPROCESSABLE_CONTENT', 'Attach the file in the "file" field.', [
            { path: ['file'], message: 'missing' },
          ]),
        );
      settled = true;
      const fileName = (f.fileName || 'upload').split(/[\\/]/).pop()!.slice(0, 200);
      resolve({ fileName, bytes: new Uint8Array(Buffer.concat(f.chunks, f.size)), fields });
    });
    source.pipe(parser);
  });
}
