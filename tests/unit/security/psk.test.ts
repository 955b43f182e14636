import { describe, expect, it } from 'vitest';
import { wpaPskHex } from '../../../shared/security/psk.node';

describe('wpaPskHex (PBKDF2-HMAC-SHA1, 4096 iterations, 32 bytes)', () => {
  it('reproduces the IEEE 802.11i Annex H test vector', () => {
    // IEEE 802.11i Annex H (REFERENCES Security): "password" + "IEEE"
    expect(wpaPskHex('password', 'IEEE')).toBe('f42c6fc52df0ebef9ebb4b90b38a5f902e83fe1b135a70e23aed762e9710a12e');
  });
  it('reproduces the second Annex H vector', () => {
    // IEEE 802.11i Annex H.4 case 2 (IEEE 802.11-2016 J.4.2 test case 2): "ThisIsAPassword" + "ThisIsASSID"
    expect(wpaPskHex('ThisIsAPassword', 'ThisIsASSID')).toBe('0dc0d6eb90555ed6419756b9a15ec3e3209b63df707dd508d14581f8982721af');
  });
  it('reproduces the third Annex H vector: 32 × "a" with a 32-byte SSID of "Z"', () => {
    // IEEE 802.11i Annex H.4 case 3 (IEEE 802.11-2016 J.4.2 test case 3): the longest SSID the standard allows
    expect(wpaPskHex('a'.repeat(32), 'Z'.repeat(32))).toBe('becb93866bb8c3832cb777c2f559807c8c59afcb6eae734885001300a981cc62');
  });
  it('depends on the SSID (it is the salt)', () => {
    expect(wpaPskHex('password', 'IEEE')).not.toBe(wpaPskHex('password', 'IEEE2'));
  });
  it('passes a 64-hex key through and refuses invalid passphrases', () => {
    const hex = 'F42C6FC52DF0EBEF9EBB4B90B38A5F902E83FE1B135A70E23AED762E9710A12E';
    expect(wpaPskHex(hex, 'IEEE')).toBe(hex.toLowerCase()); // IEEE 802.11i: 64 hex digits are the PSK itself
    expect(() => wpaPskHex('short', 'IEEE')).toThrow(/8–63/);
    expect(() => wpaPskHex('password', '')).toThrow(/SSID/);
  });
});
