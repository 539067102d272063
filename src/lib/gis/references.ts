/**
 * Parcel references (pure): which strings may be a reference, and the key under which two
 * references count as the same one. The database keeps `parcel.reference_key` unique, so two
 * saves that race can never both land with references a reader could not tell apart.
 *
 * - Refused: control characters, invisible format characters (Unicode category Cf: zero-width
 *   space and joiners, soft hyphen, byte-order mark, the bidirectional embeddings, overrides and
 *   isolates such as U+202E RIGHT-TO-LEFT OVERRIDE), line and paragraph separators, and letters
 *   from more than one of the Latin, Greek and Cyrillic scripts in one reference (Unicode
 *   Technical Standard #39 §5, "mixed-script" detection).
 * - Key: NFKC (full-width forms become ASCII, UAX #15), upper case, white space collapsed,
 *   then the confusable skeleton of UTS #39 (the `unhomoglyph` package, built from Unicode's
 *   confusables.txt), so "ТАR-1" with Cyrillic Т and А has the same key as Latin "tar-1".
 */
import unhomoglyph from 'unhomoglyph';

const INVISIBLE = /[\p{Cc}\p{Cf}\p{Zl}\p{Zp}]/u;
const SCRIPTS = [
  ['Latin', /\p{Script=Latin}/u],
  ['Greek', /\p{Script=Greek}/u],
  ['Cyrillic', /\p{Script=Cyrillic}/u],
] as const;

const codePoint = (c: string) => `U+${c.codePointAt(0)!.toString(16).toUpperCase().padStart(4, '0')}`;

/** Why `reference` cannot be a parcel reference, or null when it can. Expects a trimmed string. */
export function referenceProblem(reference: string): string | null {
  const hidden = INVISIBLE.exec(reference);
  if (hidden) {
    return (
      `Parcel reference "${reference.replace(INVISIBLE, '')}" contains an invisible or text-direction control ` +
      `character (${codePoint(hidden[0])}); type the reference again without it.`
    );
  }
  const scripts = SCRIPTS.filter(([, re]) => [...reference].some((c) => re.test(c))).map(([name]) => name);
  if (scripts.length > 1) {
    return `Parcel reference "${reference}" mixes ${scripts.join(' and ')} letters, which look alike; use letters of one alphabet.`;
  }
  return null;
}

/**
 * The key two references are compared by: NFKC, upper case (full case mapping: ß → SS), white
 * space collapsed, then the confusable skeleton. Upper case before the skeleton, because
 * confusables.txt maps capital Cyrillic Т to Latin T but small т to small-capital ᴛ.
 */
export function referenceKey(reference: string): string {
  const upper = reference.normalize('NFKC').toUpperCase().normalize('NFKC').trim().replace(/\s+/g, ' ');
  return unhomoglyph(upper).normalize('NFKC');
}
