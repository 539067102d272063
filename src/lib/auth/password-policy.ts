/**
 * The one password policy, applied on every path that sets a password (invitation, reset, and
 * better-auth's own change/set endpoints should they ever be opened): see auth.ts hooks.
 * NIST SP 800-63B §5.1.1.2 and OWASP ASVS 2.1: at least 8 characters (we ask 10), allow at least 64,
 * screen against breached/common values and context-specific words. The estimate is zxcvbn's
 * (@zxcvbn-ts with its common-password list of ~49,000 entries and English dictionaries);
 * a score of 3 ("safely unguessable") is the usual bar. Pure: no I/O, but heavy (the
 * dictionaries), so islands import `passwordLengthProblem` from password-length.ts instead.
 */
import { ZxcvbnFactory, type ZxcvbnResult } from '@zxcvbn-ts/core';
import * as common from '@zxcvbn-ts/language-common';
import * as en from '@zxcvbn-ts/language-en';
import { passwordLengthProblem } from './password-length';

export { PASSWORD_MAX, PASSWORD_MIN } from './password-length';
export const PASSWORD_MIN_SCORE = 3;

/** Words that belong to this service and its demo region: guessed first by anyone attacking it. */
const SERVICE_WORDS = ['swardkeep', 'sward', 'keep', 'tarrow', 'grassland', 'authority'];

let estimator: ZxcvbnFactory | null = null;
function zxcvbn(): ZxcvbnFactory {
  estimator ??= new ZxcvbnFactory({
    dictionary: { ...common.dictionary, ...en.dictionary },
    graphs: common.adjacencyGraphs,
    translations: en.translations,
  });
  return estimator;
}

function contextWords(context: { email?: string; name?: string }): string[] {
  const [local = '', domain = ''] = (context.email ?? '').toLowerCase().split('@');
  const parts = [
    local,
    ...local.split(/[._+-]/),
    ...domain.split('.'),
    ...(context.name ?? '').toLowerCase().split(/\s+/),
  ];
  return [...SERVICE_WORDS, ...parts.filter((w) => w.length >= 3)];
}

function isCommon(result: ZxcvbnResult): boolean {
  return result.sequence.some(
    (m) =>
      m.pattern === 'dictionary' &&
      m.dictionaryName === 'passwords-common' &&
      m.token.length >= result.password.length - 2,
  );
}

/** Returns a plain-words reason the password is refused, or null when it is acceptable. */
export function passwordProblem(password: string, context: { email?: string; name?: string } = {}): string | null {
  const length = passwordLengthProblem(password);
  if (length) return length;
  const result = zxcvbn().check(password, contextWords(context));
  // Mostly made of the person's name, address or this service's name: guessed first, whatever the score.
  const contextChars = result.sequence
    .filter((m) => m.pattern === 'dictionary' && m.dictionaryName === 'userInputs')
    .reduce((n, m) => n + m.token.length, 0);
  const mostlyContext = contextChars * 2 >= password.length;
  if (result.score >= PASSWORD_MIN_SCORE && !mostlyContext) return null;
  if (isCommon(result))
    return 'This password is too common: it is on the lists of passwords attackers try first. Choose another.';
  const why =
    contextChars > 0
      ? 'It is made of your name, your e-mail address or the name of this service.'
      : (result.feedback.warning ?? '');
  return `This password is too easy to guess. ${why} Make it longer: a short sentence of four or more ordinary words works well.`.replace(
    /\s+/g,
    ' ',
  );
}
