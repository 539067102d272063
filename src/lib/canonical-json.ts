/**
 * Canonical JSON (RFC 8785 JSON Canonicalization Scheme, through the `canonicalize` package):
 * one text per value, whatever the key order. Use it whenever a document is compared or hashed
 * after a round trip through jsonb, which does not keep key order (pure; safe anywhere).
 */
import canonicalize from 'canonicalize';
import { createHash } from 'node:crypto';

export function canonicalJson(value: unknown): string {
  const text = canonicalize(value);
  if (text === undefined) throw new TypeError('The value has no JSON form.');
  return text;
}

/** Same content: equal canonical texts (key order and number spelling do not matter). */
export function sameJsonContent(a: unknown, b: unknown): boolean {
  return canonicalJson(a) === canonicalJson(b);
}

/** SHA-256 of the canonical UTF-8 text, lower-case hex. */
export function canonicalSha256(value: unknown): string {
  return createHash('sha256').update(canonicalJson(value), 'utf8').digest('hex');
}
