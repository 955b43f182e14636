import { describe, expect, it } from 'vitest';
import { congestionMwByChannel, planningSpan, recommendChannels, surveyedSpan, type RadioOnAir, type RadioToPlan } from '../../../shared/radio/channelPlan';
import { PlanningError } from '../../../shared/radio/errors';

// A made-up rooftop in the demo town; 0.001° of latitude ≈ 111 m.
const here = { lat: 47.5, lon: 8.7 };
const north = (metres: number) => ({ lat: here.lat + metres / 111_195, lon: here.lon });
const ap = (id: number, nodeId: number, band: '2.4' | '5' = '2.4', channelWidthMHz: 20 | 40 | 80 = 20): RadioToPlan => ({
  id,
  nodeId,
  band,
  channelWidthMHz,
  ...here,
});
const onAir = (nodeId: number, channel: number, metres: number, band: '2.4' | '5' = '2.4'): RadioOnAir => ({
  nodeId,
  band,
  channel,
  channelWidthMHz: 20,
  ...north(metres),
});

describe('recommendChannels', () => {
  it('keeps one node’s three 2.4 GHz radios apart: 1, 6, 11', () => {
    const plan = recommendChannels({ region: 'US', radios: [ap(1, 10), ap(2, 10), ap(3, 10)] });
    expect(plan.map((p) => p.channel)).toEqual([1, 6, 11]); // REFERENCES Channels: 1, 6, 11 — common practice
    expect(plan.every((p) => p.ownNodeOverlapMHz === 0)).toBe(true);
  });

  it('treats 2.4 GHz channels as 22 MHz wide when planning', () => {
    expect(planningSpan('2.4', 1, 20).widthMHz).toBe(22); // REFERENCES Channels: 22 MHz (802.11b mask)
    expect(planningSpan('5', 36, 20).widthMHz).toBe(20);
  });

  it('avoids a near neighbour’s channel', () => {
    const [p] = recommendChannels({ region: 'US', radios: [ap(1, 10)], nearby: [onAir(20, 1, 50)] });
    expect(p.channel).toBe(6);
    expect(p.interferenceMw).toBe(0);
  });

  it('when every channel is busy, shares with the farthest neighbour (weighted by free-space loss)', () => {
    const nearby = [onAir(20, 1, 40), onAir(21, 6, 120), onAir(22, 11, 3000)];
    // fill the gaps between 1, 6 and 11 too, so every candidate overlaps someone
    for (const ch of [2, 3, 4, 5, 7, 8, 9, 10]) nearby.push(onAir(30 + ch, ch, 60));
    const [p] = recommendChannels({ region: 'US', radios: [ap(1, 10)], nearby });
    expect(p.channel).toBe(11);
    // cost ≈ 20 dBm − FSPL(2462 MHz, 3 km) from node 22 plus the partial overlap of channel 10 at 60 m
    // ITU-R P.525 §2.2: 32.45 + 20·log10(2462) + 20·log10(3) = 32.45 + 67.83 + 9.54 = 109.82 dB
    const farMw = 10 ** ((20 - 109.82) / 10);
    expect(p.interferenceMw).toBeGreaterThan(farMw);
  });

  it('avoids congestion seen in a site survey', () => {
    const survey = {
      '2.4': [
        { channel: 1, signalDbm: -40 },
        { channel: 6, signalDbm: -50 },
        { channel: 11, signalDbm: -85 },
      ],
    };
    const [p] = recommendChannels({ region: 'US', radios: [ap(1, 10)], survey });
    expect(p.channel).not.toBe(1);
    expect(p.channel).not.toBe(6);
    const congestion = congestionMwByChannel('2.4', [1, 6, 11], survey['2.4']);
    expect(congestion.get(1)).toBeCloseTo(10 ** (-40 / 10), 12); // dBm → mW: −40 dBm = 1e-4 mW
    expect(congestion.get(11)).toBeCloseTo(10 ** (-85 / 10), 15);
  });

  it('plans wide 5 GHz channels on whole allowed blocks', () => {
    const plan = recommendChannels({ region: 'US', radios: [ap(1, 10, '5', 80), ap(2, 10, '5', 80)] });
    expect(plan.map((p) => p.channel)).toEqual([36, 52]);
    expect(plan.map((p) => p.centerMHz)).toEqual([5210, 5290]); // IEEE 802.11: channels 42 and 58
    const eu40 = recommendChannels({ region: 'EU', radios: [ap(1, 10, '5', 40)], nearby: [onAir(20, 36, 30, '5'), onAir(21, 44, 30, '5')] });
    expect(eu40[0].channel).toBe(52);
  });

  it('is deterministic whatever the input order', () => {
    const radios = [ap(3, 11), ap(1, 10), ap(2, 10), ap(4, 11)];
    const nearby = [onAir(20, 6, 200)];
    const a = recommendChannels({ region: 'EU', radios, nearby });
    const b = recommendChannels({ region: 'EU', radios: [...radios].reverse(), nearby });
    expect(a).toEqual(b);
    expect(a.map((p) => p.radioId)).toEqual([1, 2, 3, 4]);
  });

  it('refuses a width the band cannot carry', () => {
    expect(() => recommendChannels({ region: 'US', radios: [ap(1, 10, '2.4', 80)] })).toThrow(PlanningError);
  });
});

describe('surveyed wide networks sit on their fixed bonding block', () => {
  const five = [36, 40, 44, 48, 52, 56, 60, 64];
  it('primary 36 at 80 MHz fills 36–48; primary 48 at 80 MHz fills 36–48 and leaves 52 clean', () => {
    // IEEE 802.11 fixed 80 MHz blocks: channel 42 (5210 MHz centre) spans 36–48
    expect(surveyedSpan('5', 48, 80)).toEqual(expect.objectContaining({ centerMHz: 5210, widthMHz: 80 }));
    const mw = congestionMwByChannel('5', five, [{ channel: 48, channelWidthMHz: 80, signalDbm: -60 }]);
    for (const ch of [36, 40, 44, 48]) expect(mw.get(ch)).toBeCloseTo(1e-6, 12); // −60 dBm = 1e-6 mW on each covered channel
    for (const ch of [52, 56, 60, 64]) expect(mw.get(ch)).toBe(0);
    const from36 = congestionMwByChannel('5', five, [{ channel: 36, channelWidthMHz: 80, signalDbm: -60 }]);
    expect([...from36.values()]).toEqual([...mw.values()]);
  });
  it('160 MHz from primary 60 covers 36–64 (block starting at 36; from memory)', () => {
    expect(surveyedSpan('5', 60, 160)).toEqual({ centerMHz: 5250, widthMHz: 160 });
  });
});
