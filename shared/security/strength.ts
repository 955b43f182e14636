import { ZxcvbnFactory } from '@zxcvbn-ts/core';
import * as zxcvbnCommon from '@zxcvbn-ts/language-common';

let factory: ZxcvbnFactory | null = null;

/**
 * Passphrase strength from zxcvbn (Wheeler, USENIX Security 2016): score 0–4 and log10 of the guesses an
 * attacker needs. Words the owner would pick (the SSID) count as already known to the attacker.
 */
export function passphraseStrength(passphrase: string, knownWords: string[] = []): { score: 0 | 1 | 2 | 3 | 4; guessesLog10: number } {
  factory ??= new ZxcvbnFactory({ dictionary: { ...zxcvbnCommon.dictionary }, graphs: zxcvbnCommon.adjacencyGraphs });
  const result = factory.check(
    passphrase,
    knownWords.filter((w) => w.length > 0),
  );
  return { score: result.score, guessesLog10: result.guessesLog10 };
}
