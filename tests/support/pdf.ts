/**
 * Text of a PDF, read with pdf-parse (its bundled Mozilla pdf.js). The library's lib file is
 * imported directly: its package entry runs a self-test when it is not required from CommonJS.
 */
import type parsePdf from 'pdf-parse';
import parse from 'pdf-parse/lib/pdf-parse.js';

export async function pdfText(bytes: ArrayBuffer | Uint8Array): Promise<string> {
  return (await (parse as typeof parsePdf)(Buffer.from(bytes instanceof Uint8Array ? bytes : new Uint8Array(bytes))))
    .text;
}
