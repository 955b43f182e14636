import { describe, expect, it } from 'vitest';
import { pskProblem, reviewKeyReuse, reviewRadio, sortFindings, type RadioSecurityInput, type SecurityFinding } from '../../../shared/security/review';
import { passphraseStrength } from '../../../shared/security/strength';

const radio = (over: Partial<RadioSecurityInput>): RadioSecurityInput => ({
  id: 1,
  role: 'access-point',
  ssid: 'Riverside Commons',
  encryption: 'wpa2-ccmp',
  preSharedKey: 'tangle-orbit-pepper-glacier-47',
  groupRekeyS: 600,
  ...over,
});
const codes = (f: SecurityFinding[]) => f.map((x) => `${x.code}:${x.severity}`);

describe('reviewRadio', () => {
  it('finds nothing wrong with WPA2-CCMP, a strong key and rekeying', () => {
    expect(reviewRadio(radio({}))).toEqual([]);
  });
  it('flags open networks, worse on backhaul', () => {
    // REFERENCES: open networks carry no protection
    expect(codes(reviewRadio(radio({ encryption: 'none', preSharedKey: null })))).toEqual(['open_network:high']);
    expect(codes(reviewRadio(radio({ encryption: 'none', role: 'backhaul-ap' })))).toEqual(['open_network:critical']);
  });
  it('flags WEP and TKIP as deprecated, with the fix', () => {
    const wep = reviewRadio(radio({ encryption: 'wep' }));
    expect(codes(wep)).toEqual(['wep:critical']); // REFERENCES: WEP deprecated (IEEE 802.11-2012)
    expect(wep[0].fix).toMatch(/CCMP/);
    expect(codes(reviewRadio(radio({ encryption: 'wpa-tkip' })))).toEqual(['tkip:high']); // REFERENCES: TKIP deprecated
  });
  it('checks the key against IEEE 802.11i: 8–63 printable ASCII or 64 hex', () => {
    expect(pskProblem('seven77')).toMatch(/7 characters; at least 8/); // IEEE 802.11i: at least 8
    expect(pskProblem('x'.repeat(64))).toMatch(/at most 63/); // IEEE 802.11i: 64 must be hex
    expect(pskProblem('a'.repeat(64))).toBeNull(); // 64 hex digits
    expect(pskProblem('café-au-lait-2024')).toMatch(/printable ASCII/);
    expect(pskProblem('x'.repeat(63))).toBeNull();
    expect(codes(reviewRadio(radio({ preSharedKey: 'seven77' })))).toEqual(['psk_invalid:high']);
    expect(codes(reviewRadio(radio({ preSharedKey: null })))).toEqual(['psk_missing:high']);
  });
  it('flags weak keys by zxcvbn strength', () => {
    expect(codes(reviewRadio(radio({ preSharedKey: 'password123' })))).toEqual(['psk_weak:high']);
    expect(codes(reviewRadio(radio({ preSharedKey: 'RiversideCommons1' })))).toEqual(['psk_weak:high']); // the SSID is known to attackers
    expect(passphraseStrength('password').score).toBe(0);
    expect(passphraseStrength('tangle-orbit-pepper-glacier-47').score).toBe(4);
  });
  it('does not second-guess a raw 64-hex key', () => {
    expect(reviewRadio(radio({ preSharedKey: 'f42c6fc52df0ebef9ebb4b90b38a5f902e83fe1b135a70e23aed762e9710a12e' }))).toEqual([]);
  });
  it('flags group rekey disabled (0) as low', () => {
    const f = reviewRadio(radio({ groupRekeyS: 0 }));
    expect(codes(f)).toEqual(['group_rekey_disabled:low']); // REFERENCES: 0 disables rekeying (common practice)
    expect(f[0].fix).toMatch(/600 s/);
  });
});

describe('reviewKeyReuse', () => {
  it('flags one key used across neighbourhoods, never echoing it', () => {
    const f = reviewKeyReuse([
      { id: 4, neighbourhoodId: 1, preSharedKey: 'shared-secret-key-9' },
      { id: 2, neighbourhoodId: 2, preSharedKey: 'shared-secret-key-9' },
      { id: 7, neighbourhoodId: 1, preSharedKey: 'other-key-entirely-3' },
      { id: 8, neighbourhoodId: 1, preSharedKey: 'other-key-entirely-3' },
      { id: 9, neighbourhoodId: 3, preSharedKey: null },
    ]);
    expect(f).toHaveLength(1);
    expect(f[0]).toMatchObject({ code: 'key_reused', severity: 'medium', radioIds: [2, 4] });
    expect(JSON.stringify(f)).not.toContain('shared-secret-key-9');
  });
});

describe('sortFindings', () => {
  it('orders critical → low, then by code and radio', () => {
    const all = [
      ...reviewRadio(radio({ id: 3, groupRekeyS: 0 })),
      ...reviewRadio(radio({ id: 2, encryption: 'wpa-tkip', preSharedKey: 'password123' })),
      ...reviewRadio(radio({ id: 1, encryption: 'wep' })),
    ];
    expect(sortFindings(all).map((f) => `${f.severity}:${f.code}:${f.radioIds?.[0]}`)).toEqual([
      'critical:wep:1',
      'high:psk_weak:2',
      'high:tkip:2',
      'low:group_rekey_disabled:3',
    ]);
  });
});
