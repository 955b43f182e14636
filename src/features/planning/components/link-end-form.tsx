import { SelectField, TextField } from '../../../components/form-field';
import { useNodeChoices, useRadioChoices, useSiteChoices } from '../api/inventory';

export interface LinkEnd {
  mode: 'site' | 'coords';
  siteId: string;
  nodeId: string;
  radioId: string;
  lat: string;
  lon: string;
  groundElevationM: string;
  heightM: string;
  txPowerDbm: string;
  antennaGainDbi: string;
  cableLossDb: string;
}
export const emptyEnd = (): LinkEnd => ({
  mode: 'site',
  siteId: '',
  nodeId: '',
  radioId: '',
  lat: '',
  lon: '',
  groundElevationM: '0',
  heightM: '10',
  txPowerDbm: '20',
  antennaGainDbi: '23',
  cableLossDb: '1',
});

/** A radio the end uses, as its band and channel are needed for the frequency. */
export interface PickedRadio {
  id: number;
  band: '2.4' | '5';
  channel: number;
  channelWidthMHz: number;
}

/** One end of the path: a site from the inventory (and optionally its node and radio) or typed coordinates. */
export function LinkEndForm({
  label,
  value,
  onChange,
  onRadio,
}: {
  label: string;
  value: LinkEnd;
  onChange: (v: LinkEnd) => void;
  onRadio: (r: PickedRadio | null) => void;
}) {
  const sites = useSiteChoices();
  const nodes = useNodeChoices(value.siteId ? Number(value.siteId) : undefined);
  const radios = useRadioChoices(value.nodeId ? Number(value.nodeId) : null);
  const set = (patch: Partial<LinkEnd>) => onChange({ ...value, ...patch });
  const byHand = value.radioId === '';

  function pickSite(id: string) {
    const s = sites.data?.find((x) => String(x.id) === id);
    onRadio(null);
    set(
      s
        ? {
            siteId: id,
            nodeId: '',
            radioId: '',
            lat: String(s.latitude),
            lon: String(s.longitude),
            groundElevationM: String(s.groundElevationM),
            heightM: String(s.antennaHeightM),
          }
        : { siteId: '', nodeId: '', radioId: '' },
    );
  }
  function pickRadio(id: string) {
    const r = radios.data?.find((x) => String(x.id) === id);
    onRadio(r ? { id: r.id, band: r.band, channel: r.channel, channelWidthMHz: r.channelWidthMHz } : null);
    set(r ? { radioId: id, txPowerDbm: String(r.txPowerDbm), antennaGainDbi: String(r.antennaGainDbi), cableLossDb: String(r.cableLossDb) } : { radioId: '' });
  }

  return (
    <fieldset className="min-w-0 space-y-3 rounded-lg border border-line bg-surface p-4" data-testid={`link-end-${label.toLowerCase()}`}>
      <legend className="px-1 text-sm font-semibold">End {label}</legend>
      <div className="flex gap-4 text-sm">
        {(['site', 'coords'] as const).map((m) => (
          <label key={m} className="flex items-center gap-1.5">
            <input
              type="radio"
              name={`mode-${label}`}
              checked={value.mode === m}
              onChange={() => {
                onRadio(null);
                set({ mode: m, siteId: '', nodeId: '', radioId: '' });
              }}
            />
            {m === 'site' ? 'Site from the inventory' : 'Type coordinates'}
          </label>
        ))}
      </div>
      {value.mode === 'site' && (
        <div className="grid gap-3 sm:grid-cols-2">
          <SelectField
            label={`Site ${label}`}
            value={value.siteId}
            onChange={(e) => pickSite(e.target.value)}
            placeholder="Choose a site"
            options={(sites.data ?? []).map((s) => ({ value: String(s.id), label: s.name }))}
          />
          <SelectField
            label={`Node ${label}`}
            value={value.nodeId}
            disabled={!value.siteId}
            onChange={(e) => {
              onRadio(null);
              set({ nodeId: e.target.value, radioId: '' });
            }}
            placeholder={nodes.data?.length === 0 ? 'No node at this site' : 'Choose a node'}
            options={(value.siteId ? (nodes.data ?? []) : []).map((n) => ({ value: String(n.id), label: n.name }))}
            hint="Needed to save the link."
          />
          <SelectField
            label={`Radio ${label}`}
            value={value.radioId}
            disabled={!value.nodeId}
            onChange={(e) => pickRadio(e.target.value)}
            placeholder="New radio, typed by hand"
            options={(radios.data ?? []).map((r) => ({ value: String(r.id), label: `${r.iface} · ${r.band} GHz ch ${r.channel} · ${r.antennaGainDbi} dBi` }))}
          />
        </div>
      )}
      <div className="grid grid-cols-2 gap-3 lg:grid-cols-4">
        <TextField label="Latitude (°)" inputMode="decimal" value={value.lat} readOnly={value.mode === 'site'} onChange={(e) => set({ lat: e.target.value })} />
        <TextField
          label="Longitude (°)"
          inputMode="decimal"
          value={value.lon}
          readOnly={value.mode === 'site'}
          onChange={(e) => set({ lon: e.target.value })}
        />
        <TextField
          label="Ground elevation (m)"
          inputMode="decimal"
          value={value.groundElevationM}
          onChange={(e) => set({ groundElevationM: e.target.value })}
        />
        <TextField label="Antenna height (m)" inputMode="decimal" value={value.heightM} onChange={(e) => set({ heightM: e.target.value })} />
        <TextField
          label="Transmit power (dBm)"
          inputMode="decimal"
          value={value.txPowerDbm}
          readOnly={!byHand}
          onChange={(e) => set({ txPowerDbm: e.target.value })}
        />
        <TextField
          label="Antenna gain (dBi)"
          inputMode="decimal"
          value={value.antennaGainDbi}
          readOnly={!byHand}
          onChange={(e) => set({ antennaGainDbi: e.target.value })}
        />
        <TextField
          label="Cable and connector loss (dB)"
          inputMode="decimal"
          value={value.cableLossDb}
          readOnly={!byHand}
          onChange={(e) => set({ cableLossDb: e.target.value })}
          hint="From the cable’s datasheet."
        />
      </div>
    </fieldset>
  );
}
