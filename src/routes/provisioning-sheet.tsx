import { useParams } from 'react-router-dom';
import { Button } from '../components/button';
import { Caution } from '../components/caution';
import { PageHeader } from '../components/page-header';
import { LoadError, Loading } from '../components/query-state';
import { useProvisioning } from '../features/planning/api/planning';
import type { ProvisioningRadio } from '../features/planning/api/types';
import { idFromParam } from '../lib/resource';
import { NotFoundPage } from './not-found';

// On paper only the sheet: no console chrome, black on white, no split sections.
const PRINT_CSS = `@media print {
  body { background: #fff !important; color: #000 !important; }
  header, nav, [data-testid="user-menu"], #main-nav { display: none !important; }
  .provisioning-sheet a { color: #000; text-decoration: none; }
  @page { margin: 14mm; }
}`;

const ENCRYPTION: Record<string, string> = {
  none: 'None (open)',
  wep: 'WEP',
  'wpa-tkip': 'WPA with TKIP',
  'wpa2-ccmp': 'WPA2-PSK with CCMP (AES)',
  'wpa3-sae': 'WPA3-SAE',
};

function Rows({ rows }: { rows: [string, string | null | undefined][] }) {
  return (
    <dl className="grid grid-cols-[minmax(8rem,auto)_1fr] gap-x-4 gap-y-1 text-sm">
      {rows.map(([k, v]) => (
        <div key={k} className="contents">
          <dt className="text-muted">{k}</dt>
          <dd className="font-mono break-all">{v ?? '—'}</dd>
        </div>
      ))}
    </dl>
  );
}

function RadioBlock({ r, readKeys }: { r: ProvisioningRadio; readKeys: boolean }) {
  const key =
    r.encryption === 'none'
      ? 'none (open network)'
      : r.preSharedKey
        ? r.preSharedKey
        : r.hasPreSharedKey
          ? readKeys
            ? null
            : 'withheld — ask an operator of this neighbourhood'
          : 'not set';
  return (
    <section className="break-inside-avoid rounded-lg border border-line bg-surface p-4 print:border-black" data-testid={`sheet-radio-${r.iface}`}>
      <h3 className="mb-2 font-semibold">
        {r.iface} · {r.role}
      </h3>
      <Rows
        rows={[
          ['Band', `${r.band} GHz`],
          ['Channel', `${r.channel}${r.centerMHz ? ` (${r.centerMHz} MHz)` : ''}`],
          ['Channel width', `${r.channelWidthMHz} MHz`],
          ['Transmit power', `${r.txPowerDbm} dBm`],
          ['Antenna', `${r.antennaGainDbi} dBi, ${r.polarisation}, cable ${r.cableLossDb} dB`],
          ['EIRP', `${r.eirpDbm} dBm`],
          ['SSID', r.ssid],
          ['Encryption', ENCRYPTION[r.encryption] ?? r.encryption],
          ['Pre-shared key', key],
          ['Group rekey', r.groupRekeyS === 0 ? 'off' : `${r.groupRekeyS} s`],
        ]}
      />
    </section>
  );
}

export function ProvisioningSheetPage() {
  const nodeId = idFromParam(useParams().nodeId);
  const sheet = useProvisioning(nodeId);
  if (nodeId === null) return <NotFoundPage />;
  if (sheet.isPending) return <Loading />;
  if (sheet.isError) return <LoadError error={sheet.error} />;
  const s = sheet.data;
  const a = s.addresses;
  return (
    <article className="provisioning-sheet space-y-5 print:text-black" data-testid="provisioning-sheet">
      <style>{PRINT_CSS}</style>
      <PageHeader
        title={`Provisioning sheet: ${s.node.name}`}
        subtitle={`${s.site.name} · ${s.site.latitude.toFixed(5)}, ${s.site.longitude.toFixed(5)} · mast ${s.site.antennaHeightM} m · region ${s.region}`}
        actions={
          <Button className="print:hidden" onClick={() => window.print()}>
            Print
          </Button>
        }
      />
      <Caution title="Safety first">
        Working on roofs and masts can kill: never climb alone, use fall protection, keep well clear of power lines, and switch off or stay out of the beam of
        high-gain antennas while they transmit (RF exposure). Mains and PoE wiring as local codes require. Follow local codes, the regulator and licensed
        practice over this sheet.
      </Caution>
      <section className="break-inside-avoid rounded-lg border border-line bg-surface p-4 print:border-black">
        <h2 className="mb-2 font-semibold">Router and addresses</h2>
        <Rows
          rows={[
            ['Hardware', s.node.hardware],
            ['Firmware', s.node.firmware],
            ['Management address', s.node.managementAddress ?? a?.gateway ?? null],
            ['Subnet', a ? `${a.cidr} (netmask ${a.netmask})` : 'no address plan yet — allocate one under Planning → Address plan'],
            ['Gateway (router LAN address)', a?.gateway],
            ['Broadcast', a?.broadcast],
            ['DHCP range', a?.dhcpStart ? `${a.dhcpStart} – ${a.dhcpEnd}` : 'off'],
            ['Static addresses', a?.staticAddresses.join(', ') || 'none'],
            ['Time zone', s.timeZone],
          ]}
        />
      </section>
      <div className="grid gap-4 lg:grid-cols-2 print:grid-cols-2">
        {s.radios.length === 0 ? (
          <p className="text-sm text-muted">This node has no radios in the inventory.</p>
        ) : (
          s.radios.map((r) => <RadioBlock key={r.id} r={r} readKeys={s.abilities.readKeys} />)
        )}
      </div>
      <section className="break-inside-avoid rounded-lg border border-line bg-surface p-4 text-sm print:border-black">
        <h2 className="mb-2 font-semibold">Heartbeat agent</h2>
        <Rows
          rows={[
            ['Report interval', `${s.node.reportIntervalS} s`],
            ['Reports to', `${window.location.origin}${s.agent.reportPath}`],
            ['Agent script', `${window.location.origin}${s.agent.scriptPath}`],
          ]}
        />
        <p className="mt-2">
          Download the agent preconfigured with this node’s token from the node’s page (“agent” section); the token is shown once. Copy it to the router and run
          it from cron or the init system every {s.node.reportIntervalS} s.
        </p>
      </section>
    </article>
  );
}
