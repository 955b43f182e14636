import type { ReactNode } from 'react';
import type { RadioDto } from '../../../../shared/schemas/radio';
import { DataTable, type Column } from '../../../components/data-table';
import { ENCRYPTION_WORDS, ROLE_WORDS } from './radio-words';

export function RadiosTable({ radios, actions }: { radios: RadioDto[]; actions?: (radio: RadioDto) => ReactNode }) {
  const columns: Column<RadioDto>[] = [
    { key: 'iface', header: 'Interface', render: (radio) => <code>{radio.iface}</code> },
    { key: 'role', header: 'Role', render: (radio) => ROLE_WORDS[radio.role] },
    { key: 'band', header: 'Band', render: (radio) => `${radio.band} GHz` },
    { key: 'channel', header: 'Channel', align: 'right', render: (radio) => `${radio.channel} (${radio.channelWidthMHz} MHz)` },
    { key: 'txPowerDbm', header: 'Transmit power', align: 'right', render: (radio) => `${radio.txPowerDbm} dBm` },
    { key: 'antennaGainDbi', header: 'Antenna gain', align: 'right', render: (radio) => `${radio.antennaGainDbi} dBi` },
    { key: 'ssid', header: 'SSID', render: (radio) => radio.ssid ?? '—' },
    { key: 'encryption', header: 'Encryption', render: (radio) => ENCRYPTION_WORDS[radio.encryption] },
    ...(actions ? [{ key: 'actions', header: 'Actions', render: actions }] : []),
  ];
  return <DataTable caption="Radios" testId="radios-table" rows={radios} columns={columns} rowKey={(radio) => radio.id} />;
}
