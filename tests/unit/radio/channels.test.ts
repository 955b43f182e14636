import { describe, expect, it } from 'vitest';
import { channelCenterMHz, channelOverlapMHz, channelProblem, listChannels, occupiedSpan, spanOverlapMHz, validChannels } from '../../../shared/radio/channels';
import { PlanningError } from '../../../shared/radio/errors';

const numbers = (region: string, band: string) => listChannels(region, band).channels.map((c) => c.channel);
const span = (from: number, to: number, step: number) => Array.from({ length: (to - from) / step + 1 }, (_, i) => from + i * step);

describe('IEEE 802.11 channel numbering', () => {
  it('2.4 GHz: 2407 + 5n, channel 14 = 2484 MHz', () => {
    expect(channelCenterMHz('2.4', 1)).toBe(2412); // IEEE 802.11 numbering
    expect(channelCenterMHz('2.4', 6)).toBe(2437);
    expect(channelCenterMHz('2.4', 11)).toBe(2462);
    expect(channelCenterMHz('2.4', 13)).toBe(2472);
    expect(channelCenterMHz('2.4', 14)).toBe(2484); // IEEE 802.11: channel 14 is the exception
  });
  it('5 GHz: 5000 + 5n', () => {
    expect(channelCenterMHz('5', 36)).toBe(5180); // IEEE 802.11 numbering
    expect(channelCenterMHz('5', 149)).toBe(5745);
    expect(channelCenterMHz('5', 165)).toBe(5825);
  });
  it('refuses channels that do not exist', () => {
    expect(() => channelCenterMHz('2.4', 15)).toThrow(RangeError);
    expect(() => channelCenterMHz('2.4', 0)).toThrow(RangeError);
    expect(() => channelCenterMHz('5', 36.5)).toThrow(/whole number/);
  });
});

describe('allowed channels per region', () => {
  it('2.4 GHz: US 1–11, EU 1–13, JP 1–13 plus 14 for 802.11b only', () => {
    expect(numbers('US', '2.4')).toEqual(span(1, 11, 1)); // REFERENCES Channels: US 1–11
    expect(numbers('EU', '2.4')).toEqual(span(1, 13, 1)); // REFERENCES Channels: ETSI 1–13
    expect(numbers('JP', '2.4')).toEqual(span(1, 14, 1)); // REFERENCES Channels: Japan 1–13 plus 14
    const ch14 = listChannels('JP', '2.4').channels.find((c) => c.channel === 14);
    expect(ch14).toEqual({ channel: 14, centerMHz: 2484, note: expect.stringMatching(/802\.11b only/) });
  });
  it('US 5 GHz: 36–48, 52–64, 100–144, 149–165 with DFS noted', () => {
    const list = listChannels('US', '5').channels; // API.md channel route; 47 CFR §15.407 DFS bands
    expect(list.map((c) => c.channel)).toEqual([...span(36, 48, 4), ...span(52, 64, 4), ...span(100, 144, 4), ...span(149, 165, 4)]);
    for (const c of list) {
      const dfs = c.channel >= 52 && c.channel <= 144;
      expect(c.note?.includes('DFS') ?? false).toBe(dfs);
      expect(c.centerMHz).toBe(5000 + 5 * c.channel);
    }
  });
  it('EU channels 120–128 touch the 5600–5650 MHz weather-radar band: a 10 minute check (ETSI EN 301 893)', () => {
    const list = listChannels('EU', '5').channels;
    for (const c of list.filter((x) => x.channel >= 100)) expect(/10 min/.test(c.note ?? '')).toBe(c.channel >= 120 && c.channel <= 128); // 5590–5650 MHz
  });
  it('EU 5 GHz stops at channel 140 (5470–5725 MHz)', () => {
    const list = numbers('EU', '5'); // ETSI EN 301 893: 5470–5725 MHz
    expect(list).toContain(140);
    expect(list).not.toContain(144);
    expect(list).not.toContain(149);
  });
  it('refuses unknown regions and bands with a 400', () => {
    expect(() => listChannels('AU', '5')).toThrow(PlanningError);
    expect(() => listChannels('US', '6')).toThrow(/choose 2\.4 or 5/);
  });
});

describe('overlap = intersection of [f − w/2, f + w/2]', () => {
  it('at 20 MHz (OFDM) and 22 MHz (802.11b)', () => {
    expect(channelOverlapMHz('2.4', 1, 1)).toBe(20); // REFERENCES Channels: about 20 MHz wide
    expect(channelOverlapMHz('2.4', 1, 1, 22)).toBe(22); // REFERENCES Channels: 22 MHz for 802.11b
    expect(channelOverlapMHz('2.4', 1, 2)).toBe(15); // 5 MHz apart
    expect(channelOverlapMHz('2.4', 1, 2, 22)).toBe(17);
    expect(channelOverlapMHz('2.4', 1, 5)).toBe(0); // 20 MHz apart: touching, no overlap at 20 MHz
    expect(channelOverlapMHz('2.4', 1, 5, 22)).toBe(2); // …but 2 MHz at 22 MHz
    expect(channelOverlapMHz('2.4', 1, 6, 22)).toBe(0); // 25 MHz apart: clear at either width
    expect(channelOverlapMHz('2.4', 13, 14, 22)).toBe(10); // 2472 vs 2484 MHz: 12 MHz apart → 22 − 12
  });
  it('only three US 2.4 GHz channels are mutually clear at 22 MHz: 1, 6, 11', () => {
    const us = span(1, 11, 1);
    const clear = (set: number[]) => set.every((a, i) => set.slice(i + 1).every((b) => channelOverlapMHz('2.4', a, b, 22) === 0));
    expect(clear([1, 6, 11])).toBe(true); // REFERENCES Channels: 1, 6, 11 — common practice
    // No four channels of 1–11 are pairwise clear (exhaustive check).
    let fours = 0;
    for (const a of us) for (const b of us) for (const c of us) for (const d of us) if (a < b && b < c && c < d && clear([a, b, c, d])) fours++;
    expect(fours).toBe(0);
  });
  it('is symmetric and handles different widths', () => {
    const a = { centerMHz: 5190, widthMHz: 40 };
    const b = { centerMHz: 5200, widthMHz: 20 };
    expect(spanOverlapMHz(a, b)).toBe(20);
    expect(spanOverlapMHz(b, a)).toBe(20);
  });
});

describe('bonded channels', () => {
  it('5 GHz blocks follow IEEE 802.11 numbering (38, 42, 46, 155)', () => {
    expect(occupiedSpan('5', 40, 40).centerMHz).toBe(5190); // 36+40 → channel 38 = 5000 + 5·38 (IEEE 802.11 numbering)
    expect(occupiedSpan('5', 44, 80).centerMHz).toBe(5210); // 36–48 → channel 42 = 5210 MHz
    expect(occupiedSpan('5', 48, 40).channels).toEqual([44, 48]); // → channel 46
    expect(occupiedSpan('5', 157, 80)).toEqual({ centerMHz: 5775, widthMHz: 80, channels: [149, 153, 157, 161] });
  });
  it('2.4 GHz 40 MHz goes up to channel 7 and down from 8', () => {
    expect(occupiedSpan('2.4', 1, 40).centerMHz).toBe(2422); // common practice HT40+: centre of channel 3
    expect(occupiedSpan('2.4', 11, 40).centerMHz).toBe(2452); // HT40−: centre of channel 9
    expect(() => occupiedSpan('2.4', 6, 80)).toThrow(/no 80 MHz/);
  });
});

describe('validChannels and channelProblem: one rule for stored radios, forms and the plan', () => {
  it('5 GHz primaries sit on the 5000 + 5n raster in steps of 4; 33, 70 and 196 are off it', () => {
    // IEEE 802.11 channel numbering with the region tables above (REFERENCES Channels)
    expect(validChannels('5', 20)).toEqual([...span(36, 64, 4), ...span(100, 144, 4), ...span(149, 165, 4)]);
    for (const ch of [33, 70, 196])
      expect(channelProblem('5', ch, 20)).toEqual({ field: 'channel', message: expect.stringMatching(/raster.*36–64, 100–144, 149–165 in steps of 4/) });
  });
  it('2.4 GHz has no 80 MHz channel, and the problem names the width field', () => {
    expect(validChannels('2.4', 80)).toEqual([]); // IEEE 802.11-2020 clause 21: VHT is 5 GHz only
    expect(channelProblem('2.4', 6, 80)).toEqual({ field: 'channelWidthMHz', message: expect.stringMatching(/no 80 MHz/) });
  });
  it('a wide channel needs its whole fixed bonding block: 165 has no 40 MHz partner; 144 at 80 MHz is US-only', () => {
    // IEEE 802.11 fixed 40/80 MHz blocks (36+40, 36–48, 132–144, 149–161)
    expect(validChannels('5', 40, 'US')).not.toContain(165);
    expect(channelProblem('5', 165, 40)?.field).toBe('channel');
    expect(validChannels('5', 80, 'US')).toContain(144);
    expect(validChannels('5', 80, 'EU')).not.toContain(132); // ETSI band ends at 5725 MHz, channel 144 is outside it
    expect(validChannels('5', 80, 'EU')).toEqual([...span(36, 64, 4), ...span(100, 128, 4)]);
    expect(channelProblem('2.4', 14, 40)?.message).toMatch(/channel 14 cannot be bonded/);
    expect(channelProblem('5', 149, 80)).toBeNull();
  });
});
