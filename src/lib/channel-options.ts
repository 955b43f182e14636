import { BANDS, CHANNEL_WIDTHS_MHZ, type Band, type ChannelWidthMHz } from '../../shared/enums';
import { CHANNEL_REGIONS, channelCenterMHz, listChannels, validChannels, type ChannelRegion } from '../../shared/radio/channels';
import type { Option } from '../components/form-field';

// The choices every form offers for band, width and channel: one rule, validChannels/channelProblem in shared/radio/channels.ts.

/** The network's region as a channel table's region, or undefined while it loads (or if it has none). */
export function channelRegionOf(region: string | undefined): ChannelRegion | undefined {
  return CHANNEL_REGIONS.find((r) => r === region);
}

export const bandOptions: Option[] = BANDS.map((b) => ({ value: b, label: `${b} GHz` }));
export const isBand = (text: string): text is Band => (BANDS as readonly string[]).includes(text);
export const asWidth = (text: string): ChannelWidthMHz => (Number(text) === 40 ? 40 : Number(text) === 80 ? 80 : 20);

/** Widths with at least one usable channel in the region and band (no 80 MHz on 2.4 GHz). */
export function widthOptions(region: ChannelRegion, band: Band): Option[] {
  return CHANNEL_WIDTHS_MHZ.filter((w) => validChannels(band, w, region).length > 0).map((w) => ({ value: String(w), label: `${w} MHz` }));
}

/**
 * Primary channels usable at the band and width in the region (shared/radio/channels.ts validChannels), with their
 * centre frequency and any condition (DFS, indoor only). A stored channel outside the list stays visible, marked,
 * so an edit never changes it silently.
 */
export function channelOptions(region: ChannelRegion, band: Band, widthMHz: ChannelWidthMHz, current?: string): Option[] {
  const notes = new Map(listChannels(region, band).channels.map((c) => [c.channel, c.note]));
  const options: Option[] = validChannels(band, widthMHz, region).map((channel) => {
    const note = notes.get(channel);
    return { value: String(channel), label: `${channel} (${channelCenterMHz(band, channel)} MHz)${note ? ` · ${note}` : ''}` };
  });
  const kept = current ? Number(current) : NaN;
  if (Number.isInteger(kept) && !options.some((o) => o.value === current)) {
    options.unshift({ value: current!, label: `${kept} · not usable at ${widthMHz} MHz in ${region}: choose another` });
  }
  return options;
}
