/**
 * What an attached file really is, read from its bytes (never its name): PDF, PNG or JPEG.
 * Pure. Anything else, and images whose declared size would take more than a sane amount of
 * memory to open (a decompression bomb), is refused with a reason in plain words.
 */
export type AttachmentType = 'application/pdf' | 'image/png' | 'image/jpeg';

/** Largest image we accept, in pixels (about 16,000 x 12,500; far above any scan or photo). */
export const MAX_IMAGE_PIXELS = 200_000_000;

const starts = (b: Uint8Array, sig: number[]) => sig.every((v, i) => b[i] === v);

function pngProblem(b: Uint8Array): string | null {
  // PNG spec (ISO/IEC 15948) §5.2-5.3: the first chunk is IHDR with width and height as 4-byte big-endian.
  if (b.length < 33 || String.fromCharCode(...b.subarray(12, 16)) !== 'IHDR')
    return 'the file says it is a PNG image but has no image header.';
  const view = new DataView(b.buffer, b.byteOffset, b.byteLength);
  const [w, h] = [view.getUint32(16), view.getUint32(20)];
  if (w === 0 || h === 0) return 'the PNG image has no pixels.';
  if (w * h > MAX_IMAGE_PIXELS)
    return `the PNG image claims ${w} x ${h} pixels, more than the ${MAX_IMAGE_PIXELS.toLocaleString('en')} allowed.`;
  return null;
}

function jpegProblem(b: Uint8Array): string | null {
  // ITU-T T.81 Annex B: segments follow SOI; a start-of-frame marker (C0-CF except C4, C8, CC) carries height then width.
  let at = 2;
  while (at + 9 < b.length) {
    if (b[at] !== 0xff) return 'the JPEG image is damaged (no segment marker where one should be).';
    const marker = b[at + 1]!;
    const len = (b[at + 2]! << 8) | b[at + 3]!;
    if (marker >= 0xc0 && marker <= 0xcf && ![0xc4, 0xc8, 0xcc].includes(marker)) {
      const h = (b[at + 5]! << 8) | b[at + 6]!;
      const w = (b[at + 7]! << 8) | b[at + 8]!;
      if (w * h > MAX_IMAGE_PIXELS) return `the JPEG image claims ${w} x ${h} pixels, more than allowed.`;
      return w && h ? null : 'the JPEG image has no pixels.';
    }
    if (len < 2) return 'the JPEG image is damaged.';
    at += 2 + len;
  }
  return 'the JPEG image has no frame header; it may be cut short.';
}

export function detectAttachmentType(bytes: Uint8Array): { type: AttachmentType } | { problem: string } {
  if (bytes.length === 0) return { problem: 'the file is empty.' };
  if (starts(bytes, [0x25, 0x50, 0x44, 0x46, 0x2d])) {
    // ISO 32000-1 §7.5.5: a PDF ends with %%EOF (allowing trailing white space).
    const tail = new TextDecoder('latin1').decode(bytes.subarray(Math.max(0, bytes.length - 1024)));
    return tail.includes('%%EOF')
      ? { type: 'application/pdf' }
      : { problem: 'the PDF is incomplete (it has no end-of-file marker); it may be cut short.' };
  }
  if (starts(bytes, [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])) {
    const p = pngProblem(bytes);
    return p ? { problem: p } : { type: 'image/png' };
  }
  if (starts(bytes, [0xff, 0xd8, 0xff])) {
    const p = jpegProblem(bytes);
    return p ? { problem: p } : { type: 'image/jpeg' };
  }
  if (starts(bytes, [0x50, 0x4b])) return { problem: 'it is a zip archive, not a PDF, PNG or JPEG file.' };
  if (starts(bytes, [0x4d, 0x5a]) || starts(bytes, [0x7f, 0x45, 0x4c, 0x46]))
    return { problem: 'it is a program, not a document.' };
  const head = new TextDecoder('utf-8', { fatal: false }).decode(bytes.subarray(0, 512)).trimStart().toLowerCase();
  if (head.startsWith('<')) return { problem: 'it is a web page or markup, not a PDF, PNG or JPEG file.' };
  return { problem: 'it is not a PDF, PNG or JPEG file (judged by its content, not its name).' };
}
