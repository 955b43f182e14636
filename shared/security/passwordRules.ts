import * as zxcvbnCommon from '@zxcvbn-ts/language-common';
import { z } from 'zod';
import { passphraseStrength } from './strength';

export const PASSWORD_MIN_LENGTH = 12;
/** zxcvbn score 3 = "safely unguessable: moderate protection from offline slow-hash scenario" (Wheeler 2016). */
export const PASSWORD_MIN_SCORE = 3;

// The common-password list is zxcvbn-ts's own "passwords-common" dictionary (@zxcvbn-ts/language-common,
// about 49 000 passwords most often found in leaked password lists), compared without case.
let common: Set<string> | null = null;
const commonPasswords = () => (common ??= new Set(zxcvbnCommon.dictionary['passwords-common'].map((p) => String(p).toLowerCase())));

export const isCommonPassword = (password: string) => commonPasswords().has(password.toLowerCase());

/**
 * Why a password is refused, in words a person can act on, or null when it is good enough.
 * Known words (the person's own name and e-mail) count as already known to an attacker.
 */
export function passwordProblem(password: string, knownWords: string[] = []): string | null {
  if (password.length < PASSWORD_MIN_LENGTH) return `must be at least ${PASSWORD_MIN_LENGTH} characters`;
  if (isCommonPassword(password)) return 'is on the list of commonly used passwords; choose another';
  const words = knownWords.flatMap((w) => w.toLowerCase().split(/[^a-z0-9]+/)).filter((w) => w.length >= 3);
  if (passphraseStrength(password, words).score < PASSWORD_MIN_SCORE) {
    return 'is too easy to guess; use a longer phrase of unrelated words, not your name or e-mail';
  }
  // zxcvbn alone lets "marigold-fenwick-2026" through for Marigold Fenwick. Verifiers should refuse
  // context-specific words such as the user's name (NIST SP 800-63B §5.1.1.2, from memory); what is left
  // without them must still be 8 characters (the threshold is common practice, not a standard's).
  const rest = words.reduce((left, w) => left.split(w).join(''), password.toLowerCase()).replace(/[^a-z0-9]/g, '');
  if (words.length > 0 && rest.length < 8) return 'is mostly your own name or e-mail address; use words that have nothing to do with you';
  return null;
}

/** A new password: length first (cheap), then the list and the strength estimate. */
export const newPasswordSchema = z
  .string({ error: 'is required' })
  .max(1024, 'is too long')
  .superRefine((value, ctx) => {
    const problem = passwordProblem(value);
    if (problem) ctx.addIssue({ code: 'custom', message: problem });
  });
