import { describe, expect, it } from 'vitest';
import { isCommonPassword, newPasswordSchema, passwordProblem } from '../../../shared/security/passwordRules';

// Strength is zxcvbn's estimate (Wheeler, "zxcvbn: Low-Budget Password Strength Estimation", USENIX Security 2016);
// the common list is @zxcvbn-ts/language-common's "passwords-common" dictionary.
describe('password rules', () => {
  it('needs at least 12 characters', () => {
    expect(passwordProblem('eleven-char')).toBe('must be at least 12 characters');
    expect(passwordProblem('copper-kettle-moth')).toBeNull();
  });

  it('refuses passwords on the common list whatever their case', () => {
    expect(isCommonPassword('password1234')).toBe(true);
    expect(isCommonPassword('QWERTYUIOP123')).toBe(true);
    expect(passwordProblem('Password1234')).toBe('is on the list of commonly used passwords; choose another');
  });

  it('refuses long but guessable passwords (zxcvbn score below 3)', () => {
    expect(passwordProblem('aaaaaaaaaaaaaaaa')).toBe('is too easy to guess; use a longer phrase of unrelated words, not your name or e-mail');
    expect(passwordProblem('harbourharbour')).toMatch(/too easy to guess/);
  });

  it('counts the person’s own name as known to an attacker', () => {
    expect(passwordProblem('wrenwrenaldous')).toBeNull();
    expect(passwordProblem('wrenwrenaldous', ['Wren Aldous'])).toMatch(/too easy to guess/);
  });

  it('refuses a password that is mostly the person’s own name or address even when zxcvbn rates it well', () => {
    // NIST SP 800-63B §5.1.1.2 (from memory): refuse context-specific words such as the user name.
    const known = ['Marigold Fenwick', 'marigold.fenwick@lindenfall.example'];
    expect(passwordProblem('marigold-fenwick-2026')).toBeNull();
    expect(passwordProblem('marigold-fenwick-2026', known)).toBe('is mostly your own name or e-mail address; use words that have nothing to do with you');
    expect(passwordProblem('Fenwick.Lindenfall!', known)).toMatch(/mostly your own name/);
    // Enough of the password's own (8 characters beyond the name, a common-practice threshold) passes.
    expect(passwordProblem('marigold-quartz-lantern-9', known)).toBeNull();
  });

  it('the schema gives the same message', () => {
    const r = newPasswordSchema.safeParse('password1234');
    expect(r.success).toBe(false);
    expect(r.error!.issues[0].message).toBe('is on the list of commonly used passwords; choose another');
    expect(newPasswordSchema.safeParse('saltmarsh-heron-violin-quay').success).toBe(true);
  });
});
