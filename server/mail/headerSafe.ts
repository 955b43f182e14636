// Mail headers end at CR/LF, so a name or subject carrying one could add headers of its own
// (RFC 5322 §2.2). Everything that reaches a header passes through here first.

/** Text for a header: control characters (CR, LF, tab, NUL…) become spaces, runs of spaces one, at most `max` characters. */
export function headerText(value: string, max = 200): string {
  /* eslint-disable no-control-regex -- control characters are exactly what must not reach a header */
  return (
    value
      .replace(/[\u0000-\u001f\u007f\u2028\u2029]+/g, ' ')
      /* eslint-enable no-control-regex */
      .replace(/\s{2,}/g, ' ')
      .trim()
      .slice(0, max)
  );
}

/** A plain addr-spec with no spaces, controls or angle brackets; anything else is refused, not repaired. */
export function isSafeAddress(address: string): boolean {
  /* eslint-disable no-control-regex -- an address carrying control characters is refused */
  return (
    address.length <= 254 &&
    /^[^\s<>()",;:\\[\]\u0000-\u001f\u007f@]+@[^\s<>()",;:\\[\]\u0000-\u001f\u007f@]+\.[^\s<>()",;:\\[\]\u0000-\u001f\u007f@]+$/.test(address)
  );
  /* eslint-enable no-control-regex */
}
