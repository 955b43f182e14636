import { describe, expect, it } from 'vitest';
import { computeRegulatory, type RegulatoryInput } from '../../../shared/radio/regulatory';
import { PlanningError } from '../../../shared/radio/errors';

const us = (over: Partial<RegulatoryInput>): RegulatoryInput => ({
  region: 'US',
  freqMHz: 2437,
  antennaGainDbi: 6,
  txPowerDbm: 20,
  cableLossDb: 0,
  linkType: 'point-to-point',
  ...over,
});
const eu = (over: Partial<RegulatoryInput>): RegulatoryInput => ({ ...us(over), region: 'EU', ...over });

describe('US 47 CFR §15.247, 2400–2483.5 MHz', () => {
  it('worked example: 24 dBi point-to-point → 24 dBm conducted, 48 dBm EIRP', () => {
    const r = computeRegulatory(us({ antennaGainDbi: 24, txPowerDbm: 24 })); // REFERENCES §15.247 worked example
    expect(r.maxTxPowerDbm).toBe(24);
    expect(r.maxEirpDbm).toBe(48);
    expect(r.eirpDbm).toBe(48);
    expect(r.compliant).toBe(true);
    expect(r.rule).toMatch(/§15\.247/);
    expect(r.rule).toMatch(/regulator decides/);
  });
  it('point-to-multipoint loses 1 dB per dB above 6 dBi: 36 dBm EIRP', () => {
    const r = computeRegulatory(us({ antennaGainDbi: 24, linkType: 'point-to-multipoint' })); // §15.247(b)(4)
    expect(r.maxTxPowerDbm).toBe(12);
    expect(r.maxEirpDbm).toBe(36); // REFERENCES: point-to-multipoint, so 36 dBm EIRP
  });
  it('allows 30 dBm with 6 dBi or less, and never more', () => {
    expect(computeRegulatory(us({ antennaGainDbi: 6 })).maxTxPowerDbm).toBe(30); // §15.247(b)(3): 1 W
    expect(computeRegulatory(us({ antennaGainDbi: 2 })).maxTxPowerDbm).toBe(30); // low gain earns no extra power
  });
  it('reduces a gain that is not 6 + 3n dBi in proportion, not rounded', () => {
    expect(computeRegulatory(us({ antennaGainDbi: 10 })).maxTxPowerDbm).toBeCloseTo(30 - 4 / 3, 2); // (10 − 6)/3 = 1.33 dB
  });
  it('limits conducted power: cable loss lowers EIRP but buys no extra power', () => {
    const r = computeRegulatory(us({ antennaGainDbi: 24, txPowerDbm: 24, cableLossDb: 2 }));
    expect(r.maxTxPowerDbm).toBe(24);
    expect(r.eirpDbm).toBe(46);
    const over = computeRegulatory(us({ antennaGainDbi: 24, txPowerDbm: 25, cableLossDb: 2 }));
    expect(over.eirpDbm).toBe(47); // below 48 dBm EIRP…
    expect(over.compliant).toBe(false); // …but 25 dBm conducted exceeds 24 dBm
    expect(over.rule).toMatch(/lower the radio to 24\.00 dBm/);
  });
  it('refuses channel 14 (2484 MHz), outside 2400–2483.5 MHz', () => {
    expect(() => computeRegulatory(us({ freqMHz: 2484 }))).toThrow(PlanningError);
  });
});

describe('US 5 GHz', () => {
  it('5725–5850 MHz point-to-point needs no reduction (§15.247(c)(1)(ii))', () => {
    const r = computeRegulatory(us({ freqMHz: 5800, antennaGainDbi: 30, txPowerDbm: 30 })); // REFERENCES §15.247
    expect(r.maxTxPowerDbm).toBe(30);
    expect(r.maxEirpDbm).toBe(60);
    expect(r.compliant).toBe(true);
  });
  it('5725–5850 MHz point-to-multipoint is reduced 1 dB per dB', () => {
    expect(computeRegulatory(us({ freqMHz: 5800, antennaGainDbi: 16, linkType: 'point-to-multipoint' })).maxTxPowerDbm).toBe(20); // §15.247(b)(4)
  });
  it('U-NII-2C (5470–5725 MHz) allows 250 mW with DFS (§15.407(a)(2))', () => {
    const r = computeRegulatory(us({ freqMHz: 5500, antennaGainDbi: 6 }));
    expect(r.maxTxPowerDbm).toBeCloseTo(23.98, 2); // §15.407(a)(2): 250 mW = 10·log10(250) = 23.98 dBm
    expect(r.rule).toMatch(/DFS/);
    expect(computeRegulatory(us({ freqMHz: 5500, antennaGainDbi: 16 })).maxTxPowerDbm).toBeCloseTo(13.98, 2); // less 1 dB per dB above 6 dBi
  });
  it('refuses 5400 MHz, between U-NII-2A and 2C', () => {
    try {
      computeRegulatory(us({ freqMHz: 5400 }));
      expect.unreachable('should have thrown');
    } catch (e) {
      expect(e).toBeInstanceOf(PlanningError);
      expect((e as PlanningError).status).toBe(400);
      expect((e as PlanningError).code).toBe('frequency_not_licence_exempt');
      expect((e as PlanningError).message).toMatch(/5400 MHz is outside the US/);
    }
  });
});

describe('EU (ETSI)', () => {
  it('EN 300 328: 20 dBm EIRP on 2.4 GHz, cable loss counts', () => {
    const r = computeRegulatory(eu({ antennaGainDbi: 14, cableLossDb: 2, txPowerDbm: 8 })); // REFERENCES EN 300 328
    expect(r.maxEirpDbm).toBe(20);
    expect(r.maxTxPowerDbm).toBe(8); // 20 − 14 + 2
    expect(r.eirpDbm).toBe(20);
    expect(r.compliant).toBe(true);
    expect(computeRegulatory(eu({ antennaGainDbi: 14, cableLossDb: 2, txPowerDbm: 9 })).compliant).toBe(false);
    expect(r.rule).toMatch(/EN 300 328/);
  });
  it('EN 301 893: 200 mW indoors at 5150–5350 MHz, 1 W at 5470–5725 MHz', () => {
    expect(computeRegulatory(eu({ freqMHz: 5200, deployment: 'indoor' })).maxEirpDbm).toBe(23); // REFERENCES: 200 mW EIRP
    const high = computeRegulatory(eu({ freqMHz: 5500, antennaGainDbi: 23 }));
    expect(high.maxEirpDbm).toBe(30); // REFERENCES: 1 W EIRP
    expect(high.maxTxPowerDbm).toBe(7);
    expect(computeRegulatory(eu({ freqMHz: 5500, tpc: false })).maxEirpDbm).toBe(27); // REFERENCES: 3 dB lower without TPC
  });
  it('refuses 5800 MHz, outside EN 301 893, and unknown regions', () => {
    expect(() => computeRegulatory(eu({ freqMHz: 5800 }))).toThrow(/outside the EU licence-exempt bands/);
    expect(() => computeRegulatory(us({ region: 'JP' }))).toThrow(/choose US or EU/);
  });
});

describe('US U-NII-1 and U-NII-2A, 47 CFR §15.407(a)(1)–(2)', () => {
  it('fixed point-to-point at 23 dBi keeps 1 W conducted under §15.407(a)(1)(iii), not (i)', () => {
    const r = computeRegulatory(us({ freqMHz: 5180, antennaGainDbi: 23, txPowerDbm: 30 })); // REFERENCES §15.407(a)(1)(iii): up to 23 dBi without reduction
    expect(r.maxTxPowerDbm).toBe(30);
    expect(r.maxEirpDbm).toBe(53);
    expect(r.compliant).toBe(true);
    expect(r.rule).toMatch(/§15\.407\(a\)\(1\)\(iii\)/);
    expect(computeRegulatory(us({ freqMHz: 5180, antennaGainDbi: 25 })).maxTxPowerDbm).toBe(28); // 1 dB per dB above 23 dBi
  });
  it('an outdoor access point on U-NII-1 is (a)(1)(i), reduced above 6 dBi; an indoor one is (a)(1)(ii)', () => {
    const ap = computeRegulatory(us({ freqMHz: 5180, antennaGainDbi: 10, linkType: 'point-to-multipoint' }));
    expect(ap.maxTxPowerDbm).toBe(26); // §15.407(a)(1)(i): 30 dBm less (10 − 6) dB
    expect(ap.rule).toMatch(/\(a\)\(1\)\(i\):.*125 mW/);
    expect(computeRegulatory(us({ freqMHz: 5180, linkType: 'point-to-multipoint', deployment: 'indoor' })).rule).toMatch(/\(a\)\(1\)\(ii\)/);
  });
  it('U-NII-2A (5250–5350 MHz): 250 mW conducted with DFS', () => {
    const r = computeRegulatory(us({ freqMHz: 5300, antennaGainDbi: 6, txPowerDbm: 24 }));
    expect(r.maxTxPowerDbm).toBeCloseTo(23.98, 2); // §15.407(a)(2): 250 mW
    expect(r.compliant).toBe(false); // 24 dBm is 251 mW
    // KDB 905462, from memory
    expect(r.dfs).toEqual({ channelAvailabilityCheckS: 60, nonOccupancyMin: 30, advice: expect.stringMatching(/prefer a channel without DFS/) });
  });
});

describe('band edges: the whole occupied channel must lie in one band', () => {
  it('EU 2.4 GHz: a 20 MHz channel centred at 2483 MHz crosses 2483.5 MHz', () => {
    const r = computeRegulatory(eu({ freqMHz: 2483, txPowerDbm: 10, antennaGainDbi: 2 })); // EN 300 328 band 2400–2483.5 MHz
    expect(r.compliant).toBe(false);
    expect(r.occupiedMHz).toEqual({ lo: 2473, hi: 2493 });
    expect(r.problems[0]).toMatch(/crosses the band edge at 2483.5 MHz/);
    expect(computeRegulatory(eu({ freqMHz: 2472, txPowerDbm: 10, antennaGainDbi: 2 })).compliant).toBe(true); // channel 13: 2462–2482 MHz fits
  });
  it('5720 MHz at 20 MHz crosses 5725 MHz in the EU and in the US (where the straddle is flagged for the regulator)', () => {
    // EN 301 893: 5470–5725 MHz
    expect(computeRegulatory(eu({ freqMHz: 5720, antennaGainDbi: 6, txPowerDbm: 10 })).problems[0]).toMatch(/band edge at 5725 MHz/);
    const us144 = computeRegulatory(us({ freqMHz: 5720, antennaGainDbi: 6, txPowerDbm: 10 }));
    expect(us144.compliant).toBe(false);
    expect(us144.rule).toMatch(/ask the regulator/);
  });
  it('an 80 MHz channel centred at 5530 MHz (5490–5570) fits 5470–5725 MHz; at 5690 MHz (5650–5730) it does not', () => {
    expect(computeRegulatory(eu({ freqMHz: 5530, channelWidthMHz: 80, antennaGainDbi: 23, txPowerDbm: 7 })).compliant).toBe(true); // ETSI EN 301 893
    expect(computeRegulatory(eu({ freqMHz: 5690, channelWidthMHz: 80, antennaGainDbi: 23, txPowerDbm: 7 })).compliant).toBe(false);
  });
});

describe('EU 5 GHz: TPC, indoor-only bands and DFS (ECC/DEC/(04)08, ETSI EN 301 893)', () => {
  it('5250–5350 MHz indoors: 23 dBm EIRP with TPC, 20 dBm without', () => {
    expect(computeRegulatory(eu({ freqMHz: 5300, deployment: 'indoor' })).maxEirpDbm).toBe(23); // REFERENCES: 200 mW EIRP
    expect(computeRegulatory(eu({ freqMHz: 5300, deployment: 'indoor', tpc: false })).maxEirpDbm).toBe(20); // REFERENCES: 3 dB lower without TPC
  });
  it('5470–5725 MHz without TPC: 27 dBm EIRP, so 28 dBm EIRP is not compliant', () => {
    const r = computeRegulatory(eu({ freqMHz: 5500, antennaGainDbi: 23, txPowerDbm: 5, tpc: false })); // REFERENCES: 3 dB lower without TPC
    expect(r.maxEirpDbm).toBe(27);
    expect(r.compliant).toBe(false);
  });
  it('a rooftop link on 5150–5350 MHz is not compliant, whatever its power', () => {
    const r = computeRegulatory(eu({ freqMHz: 5180, antennaGainDbi: 2, txPowerDbm: 10 })); // ECC/DEC/(04)08: indoor only
    expect(r.compliant).toBe(false);
    expect(r.problems).toEqual([expect.stringMatching(/indoor use only/)]);
    expect(computeRegulatory(eu({ freqMHz: 5180, antennaGainDbi: 2, txPowerDbm: 10, deployment: 'indoor' })).compliant).toBe(true);
  });
  it('DFS: 60 s channel availability check, 10 minutes in 5600–5650 MHz, 30 minutes off after radar', () => {
    expect(computeRegulatory(eu({ freqMHz: 5500 })).dfs?.channelAvailabilityCheckS).toBe(60); // REFERENCES ETSI EN 301 893
    const weather = computeRegulatory(eu({ freqMHz: 5620 })).dfs; // channel 124, 5610–5630 MHz
    expect(weather?.channelAvailabilityCheckS).toBe(600);
    expect(weather?.nonOccupancyMin).toBe(30);
    expect(computeRegulatory(eu({ freqMHz: 2437 })).dfs).toBeNull();
  });
});
