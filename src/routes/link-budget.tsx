import { useState, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import { Button } from '../components/button';
import { Caution } from '../components/caution';
import { CheckboxField, FormMessage, SelectField, TextField } from '../components/form-field';
import { PageHeader, Section } from '../components/page-header';
import type { Band } from '../../shared/enums';
import { channelCenterMHz, channelProblem } from '../../shared/radio/channels';
import { bandOptions, channelRegionOf, isBand, widthOptions } from '../lib/channel-options';
import type { PlannedLinkEnd } from '../../shared/schemas/planningRecords';
import { useLinkBudget, useNetworkSettings, useRegulatory, useSavePlannedLink } from '../features/planning/api/planning';
import type { LinkBudgetAnswer, RegulatoryAnswer } from '../features/planning/api/types';
import { LinkBudgetFigures, LinkVerdictBadge, LinkWarnings, RegulatoryVerdict, WidthTradeOff } from '../features/planning/components/link-budget-results';
import { ObstacleList, type ObstacleRow } from '../features/planning/components/obstacle-list';
import { TerrainTiles } from '../features/planning/components/terrain-tiles';
import { emptyEnd, LinkEndForm, type LinkEnd, type PickedRadio } from '../features/planning/components/link-end-form';
import { LinkHealthPanel } from '../features/planning/components/link-health-panel';
import { PathProfile } from '../features/planning/components/path-profile';
import { ApiError } from '../lib/api';
import { paths } from '../lib/paths';

const num = (s: string) => (s.trim() === '' ? Number.NaN : Number(s));
/** k may be typed as a fraction, as the trade writes it (4/3, 2/3). */
const fraction = (s: string) => {
  const m = /^\s*(\d+(?:\.\d+)?)\s*\/\s*(\d+(?:\.\d+)?)\s*$/.exec(s);
  return m ? Number(m[1]) / Number(m[2]) : num(s);
};
const errorText = (e: unknown) =>
  e instanceof ApiError ? [e.message, ...e.details.slice(1).map((d) => d.message)].join(' ') : 'Something went wrong. Try again.';

export function LinkBudgetPage() {
  const settings = useNetworkSettings();
  const budget = useLinkBudget();
  const regulatory = useRegulatory();
  const save = useSavePlannedLink();
  const [a, setA] = useState<LinkEnd>(emptyEnd);
  const [b, setB] = useState<LinkEnd>(emptyEnd);
  const [radioA, setRadioA] = useState<PickedRadio | null>(null);
  const [, setRadioB] = useState<PickedRadio | null>(null);
  const [radio, setRadio] = useState({ band: '5' as '2.4' | '5', channel: '100', channelWidthMHz: '20', noiseFigureDb: '5' });
  const [adv, setAdv] = useState({ streams: '1', guardInterval: 'long', kFactor: '4/3', targetRateMbps: '', terrain: false, tpc: true });
  const [obstacles, setObstacles] = useState<ObstacleRow[]>([]);
  const [result, setResult] = useState<{
    answer: LinkBudgetAnswer;
    freqMHz: number;
    width: number;
    a: LinkEnd;
    b: LinkEnd;
    obstacles: { distanceKm: number; heightM: number }[];
    reg: RegulatoryAnswer | null;
    regError: string | null;
  } | null>(null);
  const [message, setMessage] = useState<string | null>(null);
  const region = settings.data?.region ?? 'EU';
  const band = radioA?.band ?? radio.band;
  const channel = radioA?.channel ?? num(radio.channel);
  const width = radioA?.channelWidthMHz ?? num(radio.channelWidthMHz);
  const channelRegion = channelRegionOf(region) ?? 'EU';
  // A new band keeps the width only where the band offers it (no 80 MHz on 2.4 GHz).
  const chooseBand = (next: Band) => {
    const kept = widthOptions(channelRegion, next).some((o) => o.value === radio.channelWidthMHz);
    setRadio({ ...radio, band: next, channelWidthMHz: kept ? radio.channelWidthMHz : '20' });
  };

  async function compute(e: FormEvent) {
    e.preventDefault();
    setMessage(null);
    save.reset();
    // The same channel rule as stored radios (shared/radio/channels.ts); the region's own limits come back as warnings.
    const problem = Number.isInteger(channel) ? channelProblem(band, channel, width) : null;
    if (!Number.isInteger(channel) || problem) {
      setMessage(
        problem
          ? `Channel ${channel} at ${width} MHz: ${problem.field === 'channel' ? 'the channel' : 'the width'} ${problem.message}.`
          : `Channel ${radio.channel} is not a ${band} GHz channel.`,
      );
      return;
    }
    const freqMHz = channelCenterMHz(band, channel);
    // With terrain, an empty ground elevation is filled from the tiles; without, it is required as before.
    const ground = (x: LinkEnd) => (adv.terrain && x.groundElevationM.trim() === '' ? {} : { groundElevationM: num(x.groundElevationM) });
    const end = (x: LinkEnd) => ({ lat: num(x.lat), lon: num(x.lon), heightM: num(x.heightM), ...ground(x) });
    const obstacleBody = obstacles.map((o) => ({ distanceKm: num(o.distanceKm), heightM: num(o.heightM) }));
    try {
      const answer = await budget.mutateAsync({
        a: end(a),
        b: end(b),
        freqMHz,
        channelWidthMHz: width as 20 | 40 | 80,
        noiseFigureDb: num(radio.noiseFigureDb),
        txPowerDbm: num(a.txPowerDbm),
        txAntennaGainDbi: num(a.antennaGainDbi),
        txCableLossDb: num(a.cableLossDb),
        rxAntennaGainDbi: num(b.antennaGainDbi),
        rxCableLossDb: num(b.cableLossDb),
        streams: adv.streams === '2' ? 2 : 1,
        guardInterval: adv.guardInterval === 'short' ? 'short' : 'long',
        kFactor: fraction(adv.kFactor),
        obstacles: obstacleBody,
        terrain: adv.terrain,
        ...(adv.targetRateMbps.trim() ? { targetRateMbps: num(adv.targetRateMbps) } : {}),
        ...(region === 'US' || region === 'EU' ? { region } : {}),
      });
      let reg: RegulatoryAnswer | null = null;
      let regError: string | null = null;
      if (region === 'US' || region === 'EU') {
        try {
          reg = await regulatory.mutateAsync({
            region,
            freqMHz,
            antennaGainDbi: num(a.antennaGainDbi),
            txPowerDbm: num(a.txPowerDbm),
            cableLossDb: num(a.cableLossDb),
            linkType: 'point-to-point',
            channelWidthMHz: width as 20 | 40 | 80,
            tpc: adv.tpc,
            deployment: 'outdoor',
          });
        } catch (err) {
          regError = errorText(err);
        }
      }
      setResult({ answer, freqMHz, width, a, b, obstacles: obstacleBody, reg, regError });
    } catch (err) {
      setResult(null);
      setMessage(errorText(err));
    }
  }

  function endSpec(x: LinkEnd): PlannedLinkEnd | null {
    if (x.radioId) return { radioId: Number(x.radioId) };
    if (!x.nodeId) return null;
    return {
      nodeId: Number(x.nodeId),
      band,
      channel,
      channelWidthMHz: width as 20 | 40 | 80,
      txPowerDbm: num(x.txPowerDbm),
      antennaGainDbi: num(x.antennaGainDbi),
      cableLossDb: num(x.cableLossDb),
      role: 'backhaul-ap',
    };
  }
  const specA = result ? endSpec(result.a) : null;
  const specB = result ? endSpec(result.b) : null;

  return (
    <>
      <PageHeader title="Link budget" subtitle="Will this link close? Distance, loss, signal, margin and path clearance between two masts." />
      <form onSubmit={compute} className="space-y-4" noValidate>
        <div className="grid gap-4 lg:grid-cols-2">
          <LinkEndForm label="A" value={a} onChange={setA} onRadio={setRadioA} />
          <LinkEndForm label="B" value={b} onChange={setB} onRadio={setRadioB} />
        </div>
        <fieldset className="grid grid-cols-2 gap-3 rounded-lg border border-line bg-surface p-4 lg:grid-cols-4">
          <legend className="px-1 text-sm font-semibold">Radio {radioA ? '(from radio A)' : ''}</legend>
          <SelectField
            label="Band"
            value={band}
            disabled={!!radioA}
            onChange={(e) => isBand(e.target.value) && chooseBand(e.target.value)}
            options={bandOptions}
          />
          <TextField
            label="Channel"
            inputMode="numeric"
            value={radioA ? String(radioA.channel) : radio.channel}
            readOnly={!!radioA}
            onChange={(e) => setRadio({ ...radio, channel: e.target.value })}
          />
          <SelectField
            label="Channel width"
            value={String(width)}
            disabled={!!radioA}
            onChange={(e) => setRadio({ ...radio, channelWidthMHz: e.target.value })}
            options={widthOptions(channelRegion, band)}
          />
          <TextField
            label="Receiver noise figure (dB)"
            inputMode="decimal"
            value={radio.noiseFigureDb}
            onChange={(e) => setRadio({ ...radio, noiseFigureDb: e.target.value })}
          />
          <SelectField
            label="Spatial streams"
            value={adv.streams}
            onChange={(e) => setAdv({ ...adv, streams: e.target.value })}
            options={[
              { value: '1', label: '1 stream' },
              { value: '2', label: '2 streams' },
            ]}
          />
          <SelectField
            label="Guard interval"
            value={adv.guardInterval}
            onChange={(e) => setAdv({ ...adv, guardInterval: e.target.value })}
            options={[
              { value: 'long', label: 'Long (0.8 µs)' },
              { value: 'short', label: 'Short (0.4 µs)' },
            ]}
          />
          <TextField
            label="Target rate (Mb/s, optional)"
            inputMode="decimal"
            value={adv.targetRateMbps}
            onChange={(e) => setAdv({ ...adv, targetRateMbps: e.target.value })}
          />
          <TextField
            label="Effective earth factor k"
            inputMode="decimal"
            value={adv.kFactor}
            hint="4/3 is the median; 2/3 is checked too"
            onChange={(e) => setAdv({ ...adv, kFactor: e.target.value })}
          />
          <CheckboxField
            label="Ground from terrain tiles"
            checked={adv.terrain}
            hint="Uses the elevation tiles an admin uploaded"
            onChange={(e) => setAdv({ ...adv, terrain: e.target.checked })}
          />
          <CheckboxField
            label="Radio has TPC (EU 5 GHz)"
            checked={adv.tpc}
            hint="Without transmit power control the EU limit is 3 dB lower"
            onChange={(e) => setAdv({ ...adv, tpc: e.target.checked })}
          />
        </fieldset>
        <ObstacleList value={obstacles} onChange={setObstacles} />
        <FormMessage message={message} />
        <Button type="submit" variant="primary" disabled={budget.isPending}>
          {budget.isPending ? 'Computing…' : 'Compute link budget'}
        </Button>
      </form>

      {result && (
        <Section title="Result">
          <div className="space-y-4">
            <LinkVerdictBadge answer={result.answer} />
            <LinkWarnings warnings={result.answer.warnings} />
            <LinkBudgetFigures answer={result.answer} />
            <WidthTradeOff answer={result.answer} currentWidth={result.width} />
            <RegulatoryVerdict region={region} answer={result.reg} error={result.regError} />
            <PathProfile
              distanceKm={result.answer.distanceKm}
              freqMHz={result.freqMHz}
              kFactor={result.answer.kFactor}
              obstacles={result.obstacles}
              terrain={result.answer.profile}
              worst={result.answer.lineOfSight}
              a={{ label: 'A', groundM: result.answer.profile?.[0]?.groundM ?? num(result.a.groundElevationM), heightM: num(result.a.heightM) }}
              b={{ label: 'B', groundM: result.answer.profile?.at(-1)?.groundM ?? num(result.b.groundElevationM), heightM: num(result.b.heightM) }}
            />
            <div className="flex flex-wrap items-center gap-3">
              <Button
                variant="primary"
                disabled={!specA || !specB || save.isPending || save.isSuccess}
                onClick={() => specA && specB && save.mutate({ a: specA, b: specB })}
              >
                {save.isPending ? 'Saving…' : 'Save as planned link'}
              </Button>
              {(!specA || !specB) && <p className="text-sm text-muted">To save, choose a site and a node for both ends.</p>}
              {save.isSuccess && (
                <p role="status" data-testid="saved-link" className="text-sm">
                  Saved “{save.data.name}” as a planned link.{' '}
                  <Link className="underline" to={paths.topology.to(save.data.nodeAId)}>
                    See it on the map
                  </Link>{' '}
                  (drawn dashed).
                </p>
              )}
              {save.isError && <FormMessage message={errorText(save.error)} />}
            </div>
            <Caution title="Working at height">
              Mast and roof work can kill: never climb alone, use fall protection, keep clear of power lines, and stay out of the beam of high-gain antennas
              while they transmit (RF exposure is highest right in front of the dish). Check PoE and mains wiring is done to local code. Regulatory figures are
              guidance; local codes, the regulator and licensed practice decide.
            </Caution>
          </div>
        </Section>
      )}

      <Section title="Terrain tiles">
        <TerrainTiles />
      </Section>

      <Section title="Live links: measured against predicted">
        <LinkHealthPanel />
      </Section>
    </>
  );
}
