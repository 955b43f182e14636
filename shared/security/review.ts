import type { Encryption, RadioRole } from '../enums';
import { passphraseStrength } from './strength';

export type Severity = 'critical' | 'high' | 'medium' | 'low';
export const SEVERITY_ORDER: readonly Severity[] = ['critical', 'high', 'medium', 'low'];

export interface SecurityFinding {
  code: 'open_network' | 'wep' | 'tkip' | 'psk_missing' | 'psk_invalid' | 'psk_weak' | 'group_rekey_disabled' | 'key_reused';
  severity: Severity;
  message: string;
  fix: string;
  radioIds?: number[];
}
export interface RadioSecurityInput {
  id?: number;
  role: RadioRole;
  ssid?: string | null;
  encryption: Encryption;
  preSharedKey?: string | null;
  groupRekeyS: number;
}

const USE_CCMP = 'Switch to WPA2 with CCMP (AES), or WPA3-SAE where every device supports it.';

// Pre-shared passphrase rule, IEEE 802.11i: 8–63 printable ASCII characters, or exactly 64 hex digits.
export function pskProblem(psk: string): string | null {
  if (/^[0-9a-fA-F]{64}$/.test(psk)) return null;
  if (/[^\x20-\x7e]/.test(psk)) return 'contains characters outside printable ASCII';
  if (psk.length < 8) return `is ${psk.length} characters; at least 8 are required`;
  if (psk.length > 63) return `is ${psk.length} characters; at most 63 are allowed (or exactly 64 hex digits)`;
  return null;
}

/** The SSID, run together, and its words: what an attacker tries first against a key. */
function ssidWords(ssid: string | null | undefined): string[] {
  if (!ssid) return [];
  const words = ssid.split(/[^A-Za-z0-9]+/).filter((w) => w.length >= 3);
  return [ssid, words.join(''), ...words];
}

function keyFindings(radio: RadioSecurityInput, ids: number[] | undefined): SecurityFinding[] {
  const psk = radio.preSharedKey ?? '';
  if (psk === '') {
    return [
      {
        code: 'psk_missing',
        severity: 'high',
        message: 'The radio is set to encrypt but has no pre-shared key recorded.',
        fix: 'Set a pre-shared key of 12 or more random characters, or a passphrase of several unrelated words.',
        radioIds: ids,
      },
    ];
  }
  const problem = radio.encryption === 'wpa3-sae' ? null : pskProblem(psk);
  if (problem) {
    return [
      {
        code: 'psk_invalid',
        severity: 'high',
        message: `The pre-shared key ${problem} (IEEE 802.11i), so devices will refuse it.`,
        fix: 'Use 8–63 printable characters or 64 hex digits; 12 or more random characters is safer.',
        radioIds: ids,
      },
    ];
  }
  if (/^[0-9a-fA-F]{64}$/.test(psk)) return [];
  const { score } = passphraseStrength(psk, ssidWords(radio.ssid));
  if (score >= 3) return [];
  return [
    {
      code: 'psk_weak',
      severity: score <= 1 ? 'high' : 'medium',
      message: `The pre-shared key is easy to guess (strength ${score} of 4): anyone who captures one handshake can try it offline.`,
      fix: 'Choose a longer key: 12 or more random characters, or four or more unrelated words, not containing the network name.',
      radioIds: ids,
    },
  ];
}

/** Findings for one radio: cipher, key and group rekey. */
export function reviewRadio(radio: RadioSecurityInput): SecurityFinding[] {
  const ids = radio.id === undefined ? undefined : [radio.id];
  const out: SecurityFinding[] = [];
  const infrastructure = radio.role !== 'access-point';
  switch (radio.encryption) {
    case 'none':
      out.push({
        code: 'open_network',
        severity: infrastructure ? 'critical' : 'high',
        message: infrastructure
          ? 'This backhaul radio is open: anyone in range can join the network’s infrastructure and read its traffic.'
          : 'This access point is open: traffic over the air carries no protection and anyone nearby can read it.',
        fix: USE_CCMP,
        radioIds: ids,
      });
      return out;
    case 'wep':
      out.push({
        code: 'wep',
        severity: 'critical',
        message: 'WEP is broken and deprecated (IEEE 802.11-2012): its key can be recovered from captured traffic in minutes.',
        fix: USE_CCMP,
        radioIds: ids,
      });
      break;
    case 'wpa-tkip':
      out.push({
        code: 'tkip',
        severity: 'high',
        message: 'TKIP is deprecated (IEEE 802.11-2012) and has known attacks; newer devices may refuse it.',
        fix: USE_CCMP,
        radioIds: ids,
      });
      break;
    default:
      break;
  }
  if (radio.encryption !== 'wep') out.push(...keyFindings(radio, ids));
  if (radio.groupRekeyS === 0) {
    out.push({
      code: 'group_rekey_disabled',
      severity: 'low',
      message: 'Group-key rekeying is off (interval 0), so the broadcast key never changes.',
      fix: 'Set the group rekey interval to 600 s (a common default); some clients drop briefly at each rekey.',
      radioIds: ids,
    });
  }
  return out;
}

/** The same key used in more than one neighbourhood: one leak opens them all. The key itself is never echoed. */
export function reviewKeyReuse(radios: { id: number; neighbourhoodId: number; preSharedKey?: string | null }[]): SecurityFinding[] {
  const byKey = new Map<string, { id: number; neighbourhoodId: number }[]>();
  for (const r of radios) {
    if (!r.preSharedKey) continue;
    byKey.set(r.preSharedKey, [...(byKey.get(r.preSharedKey) ?? []), r]);
  }
  const out: SecurityFinding[] = [];
  for (const group of byKey.values()) {
    const hoods = new Set(group.map((r) => r.neighbourhoodId));
    if (hoods.size < 2) continue;
    const ids = group.map((r) => r.id).sort((a, b) => a - b);
    out.push({
      code: 'key_reused',
      severity: 'medium',
      message: `The same pre-shared key is used by ${ids.length} radios in ${hoods.size} neighbourhoods: one leaked key opens all of them.`,
      fix: 'Give each neighbourhood its own key and change them one neighbourhood at a time.',
      radioIds: ids,
    });
  }
  return out;
}

/** Most severe first; within a severity by code, then by first radio id, so the order is stable. */
export function sortFindings<T extends SecurityFinding>(findings: T[]): T[] {
  return [...findings].sort(
    (a, b) =>
      SEVERITY_ORDER.indexOf(a.severity) - SEVERITY_ORDER.indexOf(b.severity) ||
      a.code.localeCompare(b.code) ||
      (a.radioIds?.[0] ?? 0) - (b.radioIds?.[0] ?? 0),
  );
}
