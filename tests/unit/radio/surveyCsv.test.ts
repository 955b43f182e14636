import { describe, expect, it } from 'vitest';
import { SURVEY_MAX_BYTES, SURVEY_MAX_ROWS, parseSurveyCsv } from '../../../shared/radio/surveyCsv';

describe('parseSurveyCsv', () => {
  it('reads Parapet’s column layout, in any order, with defaults', () => {
    const csv = 'ssid,channel,channelWidthMHz,signalDbm\nMill Lane Guest,6,20,-71\n"Bakery, upstairs",40,80,-63\n,11,,-88\n';
    const { rows, errors } = parseSurveyCsv(csv);
    expect(errors).toEqual([]);
    expect(rows).toEqual([
      { ssid: 'Mill Lane Guest', band: '2.4', channel: 6, channelWidthMHz: 20, signalDbm: -71 },
      { ssid: 'Bakery, upstairs', band: '5', channel: 40, channelWidthMHz: 80, signalDbm: -63 },
      { ssid: '', band: '2.4', channel: 11, channelWidthMHz: 20, signalDbm: -88 },
    ]);
    const swapped = parseSurveyCsv('signalDbm,channel\r\n-70,1\r\n');
    expect(swapped.rows).toEqual([{ ssid: '', band: '2.4', channel: 1, channelWidthMHz: 20, signalDbm: -70 }]);
  });

  it('reports each bad row with its line and keeps the good ones', () => {
    const csv = [
      'ssid,channel,channelWidthMHz,signalDbm', // line 1
      'ok,1,20,-60', // 2
      'bad channel,15,20,-60', // 3
      'bad signal,6,20,loud', // 4
      'too strong,6,20,12', // 5
      'bad width,6,30,-60', // 6
      '', // 7 (blank, skipped)
      'short,6', // 8
      '"two\nlines",149,20,-70', // 9–10
      'after,36,40,-75', // 11
    ].join('\n');
    const { rows, errors } = parseSurveyCsv(csv);
    expect(rows.map((r) => r.ssid)).toEqual(['ok', 'two\nlines', 'after']);
    expect(errors.map((e) => e.line)).toEqual([3, 4, 5, 6, 8]);
    expect(errors[0].message).toMatch(/channel 15 is not a Wi-Fi channel/);
    expect(errors[1].message).toMatch(/signalDbm "loud" must be a number/);
    expect(errors[2].message).toMatch(/between -120 and 0/);
    expect(errors[3].message).toMatch(/channelWidthMHz "30"/);
    expect(errors[4].message).toMatch(/expected 4 fields, found 2/);
  });

  it('refuses a header without the required columns or with unknown ones', () => {
    expect(parseSurveyCsv('name,signal\nx,-60').errors[0]).toEqual({ line: 1, message: expect.stringMatching(/missing channel, signaldbm/) });
    expect(parseSurveyCsv('channel,signalDbm,colour\n1,-60,red').errors[0].message).toMatch(/unknown colour/);
    expect(parseSurveyCsv('').errors[0].message).toMatch(/empty/);
  });

  it('refuses an SSID longer than 32 bytes and a band that contradicts the channel', () => {
    const { errors } = parseSurveyCsv(`ssid,channel,signalDbm,band\n${'x'.repeat(33)},6,-60,2.4\ny,6,-60,5\n`);
    expect(errors.map((e) => e.line)).toEqual([2, 3]);
    expect(errors[1].message).toMatch(/not a 5 GHz channel/);
  });

  it('enforces the size and row limits', () => {
    const big = 'ssid,channel,signalDbm\n' + 'x'.repeat(SURVEY_MAX_BYTES);
    expect(parseSurveyCsv(big)).toEqual({ rows: [], errors: [{ line: 0, message: expect.stringMatching(/larger than/) }] });
    const many = 'channel,signalDbm\n' + '1,-60\n'.repeat(SURVEY_MAX_ROWS + 5);
    const r = parseSurveyCsv(many);
    expect(r.rows).toHaveLength(SURVEY_MAX_ROWS);
    expect(r.errors).toEqual([{ line: SURVEY_MAX_ROWS + 2, message: expect.stringMatching(/more than/) }]);
  });
});
