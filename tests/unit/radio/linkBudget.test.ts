import { describe, expect, it } from 'vitest';
import {
  MIN_SENSITIVITY_DBM,
  bestMcs,
  eirpDbm,
  expectedRateMbps,
  fadeMarginDb,
  htRateMbps,
  noiseFloorDbm,
  phyRateMbps,
  rxSignalDbm,
  shannonCapacityMbps,
  snrDb,
} from '../../../shared/radio/linkBudget';

describe('EIRP and received signal', () => {
  it('EIRP = Ptx + Gtx − Ltx', () => {
    expect(eirpDbm(20, 23, 1)).toBe(42); // REFERENCES Link budget: EIRP = Ptx + Gtx − Ltx
  });
  it('Prx = Ptx + Gtx − Ltx − L + Grx − Lrx', () => {
    // REFERENCES Link budget: 20 + 23 − 1 − 120 + 23 − 1 = −56 dBm
    expect(rxSignalDbm({ txPowerDbm: 20, txAntennaGainDbi: 23, txCableLossDb: 1, pathLossDb: 120, rxAntennaGainDbi: 23, rxCableLossDb: 1 })).toBe(-56);
  });
});

describe('noise floor and SNR', () => {
  it('is −174 dBm/Hz + 10·log10(B) + NF', () => {
    expect(noiseFloorDbm(20, 0)).toBeCloseTo(-100.99, 2); // REFERENCES Noise: −174 + 73.01 at 20 MHz
    expect(noiseFloorDbm(20)).toBeCloseTo(-95.99, 2); // REFERENCES Noise, with the API default NF 5 dB
    expect(noiseFloorDbm(40, 5) - noiseFloorDbm(20, 5)).toBeCloseTo(3.01, 2); // 10·log10(2): twice the bandwidth
    expect(snrDb(-60, -95)).toBe(35); // REFERENCES Noise: SNR = Prx − N
  });
  it('Shannon bound C = B·log2(1 + SNR)', () => {
    expect(shannonCapacityMbps(20, 10 * Math.log10(3))).toBeCloseTo(40, 6); // REFERENCES Noise: SNR 3 → log2(4) = 2 b/s/Hz
  });
});

describe('PHY rates', () => {
  it('802.11g tops at 54 Mb/s: 48 × 6 × 3/4 / 4 µs', () => {
    expect(phyRateMbps(48, 6, 3 / 4)).toBe(54); // REFERENCES Rates: 802.11g
  });
  it('HT single stream, long GI: 6.5…65 at 20 MHz and 13.5…135 at 40 MHz', () => {
    // REFERENCES Rates formula N_SD·N_BPSCS·R·N_SS/T_SYM; values of IEEE 802.11-2020 HT MCS tables (from memory)
    expect([0, 1, 2, 3, 4, 5, 6, 7].map((m) => htRateMbps(m, 20))).toEqual([6.5, 13, 19.5, 26, 39, 52, 58.5, 65]);
    expect([0, 1, 2, 3, 4, 5, 6, 7].map((m) => htRateMbps(m, 40))).toEqual([13.5, 27, 40.5, 54, 81, 108, 121.5, 135]);
    expect(htRateMbps(7, 80)).toBe(292.5); // VHT 80 MHz MCS7 1SS long GI (IEEE 802.11-2020, from memory)
  });
  it('short GI (3.6 µs) gives 72.2 Mb/s for HT20 MCS7', () => {
    expect(phyRateMbps(52, 6, 5 / 6, 1, 3.6)).toBeCloseTo(72.2, 1); // REFERENCES Rates: T_SYM 3.6 µs short GI
  });
});

describe('sensitivity, expected rate and fade margin', () => {
  it('uses the IEEE 802.11-2020 minimum sensitivity tables', () => {
    expect(MIN_SENSITIVITY_DBM[20]).toEqual([-82, -79, -77, -74, -70, -66, -65, -64]); // REFERENCES: HT MCS0–7 at 20 MHz
    expect(MIN_SENSITIVITY_DBM[40]).toEqual([-79, -76, -74, -71, -67, -63, -62, -61]); // REFERENCES: 40 MHz 3 dB higher
    expect(MIN_SENSITIVITY_DBM[80]).toEqual([-76, -73, -71, -68, -64, -60, -59, -58]); // 80 MHz 3 dB above 40 MHz (IEEE 802.11-2020 VHT, from memory)
  });
  it('picks the highest MCS whose sensitivity the signal meets', () => {
    expect(expectedRateMbps(-64, 20)).toBe(65); // exactly at MCS7's −64 dBm (REFERENCES table)
    expect(expectedRateMbps(-64.01, 20)).toBe(58.5); // just below → MCS6
    expect(expectedRateMbps(-70, 40)).toBe(54); // 40 MHz: −71 ≤ −70 < −67 → MCS3
    expect(expectedRateMbps(-82, 20)).toBe(6.5); // MCS0 at its limit
    expect(expectedRateMbps(-82.5, 20)).toBe(0); // below MCS0: no link
    expect(bestMcs(-90, 20)).toBeNull();
  });
  it('fade margin is the signal above MCS0 sensitivity', () => {
    expect(fadeMarginDb(-70, 20)).toBe(12); // −70 − (−82), REFERENCES table
    expect(fadeMarginDb(-70, 40)).toBe(9); // −70 − (−79)
    expect(fadeMarginDb(-90, 20)).toBe(-8); // negative: below sensitivity
  });
});
