import type { RadioDto } from '../../../../shared/schemas/radio';
import { DataTable, type Column } from '../../../components/data-table';

const ROLE_WORDS: Record<RadioDto['role'], string> = {
  'access-point': 'Access point',
  'backhaul-client': 'Backhaul (client end)',
  'backhaul-ap': 'Backhaul (access point end)',
  mesh: 'Mesh',
};

const ENCRYPTION_WORDS: Record<RadioDto['encryption'], string> = {
  none: 'Open (none)',
  wep: 'WEP',
  'wpa-tkip': 'WPA (TKIP)',
  'wpa2-ccmp': 'WPA2 (CCMP)',
  'wpa3-sae': 'WPA3 (SAE)',
};

export function RadiosTable({ radios }: { radios: RadioDto[] }) {
  const columns: Column<RadioDto>[] = [
    { key: 'iface', header: 'Interface', render: (radio) => <code>{radio.iface}</code> },
    { key: 'role', header: 'Role', render: (radio) => ROLE_WORDS[radio.role] },
    { key: 'band', header: 'Band', render: (radio) => `${radio.band} GHz` },
    { key: 'channel', header: 'Channel', align: 'right', render: (radio) => `${radio.channel} (${radio.channelWidthMHz} MHz)` },
    { key: 'txPowerDbm', header: 'Transmit power', align: 'right', render: (radio) => `${radio.txPowerDbm} dBm` },
    { key: 'antennaGainDbi', header: 'Antenna gain', align: 'right', render: (radio) => `${radio.antennaGainDbi} dBi` },
    { key: 'ssid', header: 'SSID', render: (radio) => radio.ssid ?? '—' },
    { key: 'encryption', header: 'Encryption', render: (radio) => ENCRYPTION_WORDS[radio.encryption] },
  ];
  return <DataTable caption="Radios" rows={radios} columns={columns} rowKey={(radio) => radio.id} />;
}
