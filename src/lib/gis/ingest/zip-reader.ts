import { iter } from 'but-unzip';
import { GisInputError } from '../errors';

/** Limits for reading an uploaded zip. Both are settings of the upload route. */
export interface ZipLimits {
  /** Total bytes allowed after inflating every entry we read (zip-bomb guard). */
  maxUncompressedBytes: number;
  /** Maximum number of entries in the central directory. */
  maxEntries: number;
}

/** Local file header signature "PK\x03\x04" and empty-archive signature "PK\x05\x06". */
const ZIP_MAGIC = [0x50, 0x4b, 0x03, 0x04];
const EMPTY_ZIP_MAGIC = [0x50, 0x4b, 0x05, 0x06];
/** Feed the inflater in slices so output is produced (and counted) incrementally. */
const INFLATE_SLICE_BYTES = 64 * 1024;

function startsWith(bytes: Uint8Array, magic: number[]): boolean {
  return magic.every((b, i) => bytes[i] === b);
}

/**
 * Rejects names that could escape a target folder if anyone ever extracted the zip:
 * absolute paths, drive letters, backslashes, "..", and control characters.
 */
export function isUnsafeEntryName(name: string): boolean {
  if (name.length === 0 || name.startsWith('/') || /^[a-zA-Z]:/.test(name)) return true;
  // eslint-disable-next-line no-control-regex -- control characters in an entry name are refused
  if (name.includes('\\') || /[\u0000-\u001f]/.test(name)) return true;
  return name.split('/').some((segment) => segment === '..');
}

/** Budget shared by all entries of one zip. */
interface Budget {
  remaining: number;
  maxBytes: number;
}

async function inflateCapped(raw: Uint8Array, budget: Budget, entry: string): Promise<Uint8Array> {
  const stream = new DecompressionStream('deflate-raw');
  const writer = stream.writable.getWriter();
  const feed = (async () => {
    for (let at = 0; at < raw.length; at += INFLATE_SLICE_BYTES) {
      await writer.write(raw.subarray(at, at + INFLATE_SLICE_BYTES) as Uint8Array<ArrayBuffer>);
    }
    await writer.close();
  })();
  feed.catch(() => undefined); // errors surface through the reader below
  const reader = stream.readable.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  try {
    for (;;) {
      const { done, value } = await reader.read();
      if (done) break;
      total += value.byteLength;
      if (total > budget.remaining) {
        await reader.cancel().catch(() => undefined);
        throw tooLarge(budget, entry);
      }
      chunks.push(value);
    }
  } catch (error) {
    if (error instanceof GisInputError) throw error;
    throw new GisInputError('corrupt-zip', `Zip entry "${entry}" is damaged and cannot be decompressed.`, {
      cause: error,
    });
  }
  budget.remaining -= total;
  const out = new Uint8Array(total);
  let at = 0;
  for (const chunk of chunks) {
    out.set(chunk, at);
    at += chunk.byteLength;
  }
  return out;
}

/**
 * Lists and reads the entries of a zip held in memory, with guards against hostile archives.
 * Only entries for which `wanted(name)` is true are decompressed; directories are skipped.
 * Throws GisInputError: not-a-zip, corrupt-zip, too-many-entries, unsafe-entry-name,
 * uncompressed-too-large.
 */
export async function readZipEntries(
  bytes: Uint8Array,
  limits: ZipLimits,
  wanted: (name: string) => boolean,
): Promise<Map<string, Uint8Array>> {
  if (bytes.length < 22 || !(startsWith(bytes, ZIP_MAGIC) || startsWith(bytes, EMPTY_ZIP_MAGIC))) {
    throw new GisInputError('not-a-zip', 'The file is not a zip archive (wrong magic bytes at the start).');
  }
  let entries;
  try {
    entries = [...iter(bytes, () => new Uint8Array(0))];
  } catch (error) {
    throw new GisInputError('corrupt-zip', 'The zip archive is damaged: its central directory cannot be read.', {
      cause: error,
    });
  }
  if (entries.length > limits.maxEntries) {
    throw new GisInputError(
      'too-many-entries',
      `The zip holds ${entries.length} entries; at most ${limits.maxEntries} are allowed.`,
    );
  }
  const unsafe = entries.find((e) => isUnsafeEntryName(e.filename));
  if (unsafe) {
    throw new GisInputError(
      'unsafe-entry-name',
      `The zip contains an unsafe entry name "${unsafe.filename}" (absolute path or ".." segment).`,
    );
  }
  const budget: Budget = { remaining: limits.maxUncompressedBytes, maxBytes: limits.maxUncompressedBytes };
  const state = { name: '', inflated: false };
  const inflate = (raw: Uint8Array) => {
    state.inflated = true;
    return inflateCapped(raw, budget, state.name);
  };
  const out = new Map<string, Uint8Array>();
  for (const entry of iter(bytes, inflate)) {
    const name = entry.filename;
    if (name.endsWith('/') || !wanted(name)) continue;
    state.name = name;
    state.inflated = false;
    const data = await readEntry(entry, name);
    if (!state.inflated) {
      // Stored (uncompressed) entries bypass the inflater; count them against the same budget.
      if (data.byteLength > budget.remaining) throw tooLarge(budget, name);
      budget.remaining -= data.byteLength;
    }
    out.set(name, data);
  }
  return out;
}

function tooLarge(budget: Budget, name: string): GisInputError {
  return new GisInputError(
    'uncompressed-too-large',
    `The zip expands to more than the allowed ${budget.maxBytes} bytes (stopped at "${name}"); it may be a zip bomb.`,
  );
}

async function readEntry(entry: { read: () => Promise<Uint8Array> | Uint8Array }, name: string): Promise<Uint8Array> {
  try {
    return await entry.read();
  } catch (error) {
    if (error instanceof GisInputError) throw error;
    throw new GisInputError(
      'corrupt-zip',
      `Zip entry "${name}" uses an unsupported compression method or is damaged.`,
      { cause: error },
    );
  }
}
