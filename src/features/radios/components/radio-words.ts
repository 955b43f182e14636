import type { RadioDto } from '../../../../shared/schemas/radio';

export const ROLE_WORDS: Record<RadioDto['role'], string> = {
  'access-point': 'Access point',
  'backhaul-client': 'Backhaul (client end)',
  'backhaul-ap': 'Backhaul (access point end)',
  mesh: 'Mesh',
};

export const ENCRYPTION_WORDS: Record<RadioDto['encryption'], string> = {
  none: 'Open (none)',
  wep: 'WEP',
  'wpa-tkip': 'WPA (TKIP)',
  'wpa2-ccmp': 'WPA2 (CCMP)',
  'wpa3-sae': 'WPA3 (SAE)',
};
