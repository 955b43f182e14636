// Power unit conversions: dBm = 10·log10(P / 1 mW) (definition of the decibel-milliwatt).

/** Power in dBm → milliwatts. */
export function dbmToMw(powerDbm: number): number {
  return 10 ** (powerDbm / 10);
}

/** Power in milliwatts → dBm; zero or negative power has no dBm value. */
export function mwToDbm(powerMw: number): number {
  if (!(powerMw > 0)) throw new RangeError('power must be greater than 0 mW to express in dBm');
  return 10 * Math.log10(powerMw);
}

/** A ratio in dB → a linear power ratio. */
export function dbToRatio(gainDb: number): number {
  return 10 ** (gainDb / 10);
}
