// Fixed names of the HTTP contract (API.md "Fixed names").
export const ROLES = ['admin', 'operator', 'host'] as const;
export type Role = (typeof ROLES)[number];

export const NODE_STATES = ['online', 'degraded', 'offline', 'maintenance', 'unknown', 'stranded'] as const;
export type NodeState = (typeof NODE_STATES)[number];

export const RADIO_ROLES = ['access-point', 'backhaul-client', 'backhaul-ap', 'mesh'] as const;
export type RadioRole = (typeof RADIO_ROLES)[number];

export const BANDS = ['2.4', '5'] as const;
export type Band = (typeof BANDS)[number];

export const ENCRYPTIONS = ['none', 'wep', 'wpa-tkip', 'wpa2-ccmp', 'wpa3-sae'] as const;
export type Encryption = (typeof ENCRYPTIONS)[number];

export const CHANNEL_WIDTHS_MHZ = [20, 40, 80] as const;
export type ChannelWidthMHz = (typeof CHANNEL_WIDTHS_MHZ)[number];

export const POLARISATIONS = ['vertical', 'horizontal', 'dual', 'circular'] as const;
export type Polarisation = (typeof POLARISATIONS)[number];

export const LINK_STATUSES = ['planned', 'live'] as const;
export type LinkStatus = (typeof LINK_STATUSES)[number];

export const OUTBOX_STATUSES = ['pending', 'sent', 'failed'] as const;
export const OUTBOX_KINDS = ['node-offline', 'node-reminder', 'node-online', 'upstream-notice', 'self-check', 'invitation', 'password-reset'] as const;

/** Ranges of a node's charts (GET /nodes/:id/series). */
export const SERIES_RANGES = ['24h', '7d', '30d'] as const;
export type SeriesRange = (typeof SERIES_RANGES)[number];
