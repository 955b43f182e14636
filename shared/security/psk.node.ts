import { pbkdf2Sync } from 'node:crypto';

// WPA/WPA2 pre-shared key, IEEE 802.11i Annex H: PSK = PBKDF2-HMAC-SHA1(passphrase, SSID, 4096 iterations, 256 bits).
// Server only: node:crypto is not bundled for the browser.
export function wpaPskHex(passphrase: string, ssid: string): string {
  if (/^[0-9a-fA-F]{64}$/.test(passphrase)) return passphrase.toLowerCase(); // already the raw 256-bit key
  if (!/^[\x20-\x7e]{8,63}$/.test(passphrase)) throw new RangeError('passphrase must be 8–63 printable ASCII characters');
  const ssidBytes = Buffer.from(ssid, 'utf8');
  if (ssidBytes.length < 1 || ssidBytes.length > 32) throw new RangeError('SSID must be 1–32 bytes');
  return pbkdf2Sync(Buffer.from(passphrase, 'ascii'), ssidBytes, 4096, 32, 'sha1').toString('hex');
}
