// The demo scenario: the invented harbour town of Lindenfall and its volunteers. No real people or places.
import type { Band, Encryption, RadioRole, Role } from '../../shared/enums';

export interface DemoPerson {
  key: string;
  email: string;
  name: string;
  role: Role;
  phone?: string;
}
export interface DemoRadio {
  iface: string;
  band: Band;
  channel: number;
  channelWidthMHz: 20 | 40 | 80;
  txPowerDbm: number;
  antennaGainDbi: number;
  cableLossDb: number;
  role: RadioRole;
  ssid: string | null;
  encryption: Encryption;
  preSharedKey: string | null;
  groupRekeyS: number;
}
export interface DemoSite {
  key: string;
  name: string;
  neighbourhood: string;
  northM: number;
  eastM: number;
  groundElevationM: number;
  antennaHeightM: number;
  accessNotes: string;
  host: string | null;
  node: { name: string; hardware: string; firmware: string; isUplink: boolean; reportIntervalS: number; radios: DemoRadio[] };
}
export interface DemoLink {
  from: [string, string];
  to: [string, string];
  status: 'planned' | 'live';
  name: string;
}

/** Invented firmware and maker: the demo names no real product. */
export const DEMO_FIRMWARE = 'Tilecrest 5.1.2';

/**
 * Lindenfall's routers report every five minutes to spare airtime; two report every minute: the one
 * that drops now and then, and the one whose loose plug the operators are watching.
 */
export const REPORT_INTERVAL_S = 300;
const MINUTE_REPORTERS = ['tide', 'weir'];

export const TOWN = {
  name: 'Lindenfall Community Network',
  latitude: 47.6012,
  longitude: -38.4127,
  region: 'EU' as const,
  timeZone: 'Atlantic/Azores',
  pool: '10.64.0.0/16',
};

export const PEOPLE: DemoPerson[] = [
  { key: 'admin', email: 'admin@parapet.example', name: 'Marta Quillon', role: 'admin', phone: '+000 555 0100' },
  { key: 'operator', email: 'operator@parapet.example', name: 'Tobias Fenwright', role: 'operator', phone: '+000 555 0101' },
  { key: 'operator2', email: 'ada.pennock@parapet.example', name: 'Ada Pennock', role: 'operator' },
  { key: 'host', email: 'host@parapet.example', name: 'Rosa Hallowell', role: 'host', phone: '+000 555 0102' },
  ...['Iver Brantley', 'Nell Okoro-Vance', 'Pim Castellane', 'Dora Whitlock', 'Sami Ferrow', 'Lotte Marchbank', 'Jun Aldersey', 'Keziah Thorne'].map(
    (name, i): DemoPerson => ({ key: `h${i + 1}`, email: `${name.split(' ')[0].toLowerCase()}@residents.parapet.example`, name, role: 'host' }),
  ),
];

export const NEIGHBOURHOODS = [
  { name: 'Old Quay', description: 'Warehouses and flats along the harbour wall.', operators: ['operator'] },
  { name: 'Millbrook', description: 'Terraced streets east of the old mill race.', operators: ['operator'] },
  { name: 'Saltmarsh Row', description: 'Bungalows on the southern marsh edge.', operators: ['operator2'] },
  { name: 'Chapel Hill', description: 'Houses on the slope north of the chapel.', operators: ['operator2'] },
];

const rekey = 3600;
const ap = (
  ssid: string,
  channel: number,
  enc: Encryption = 'wpa2-ccmp',
  psk: string | null = 'lindenfall-shares-the-sky',
  extra: Partial<DemoRadio> = {},
): DemoRadio => ({
  iface: 'wlan1',
  band: '2.4',
  channel,
  channelWidthMHz: 20,
  txPowerDbm: 17,
  antennaGainDbi: 2,
  cableLossDb: 0,
  role: 'access-point',
  ssid,
  encryption: enc,
  preSharedKey: enc === 'none' ? null : psk,
  groupRekeyS: rekey,
  ...extra,
});
const backhaul = (iface: string, role: RadioRole, channel: number, gainDbi: number, extra: Partial<DemoRadio> = {}): DemoRadio => ({
  iface,
  band: '5',
  channel,
  channelWidthMHz: 40,
  txPowerDbm: 18,
  antennaGainDbi: gainDbi,
  cableLossDb: 0.5,
  role,
  ssid: 'lf-backhaul',
  encryption: 'wpa2-ccmp',
  preSharedKey: 'Qx7!backhaul-of-lindenfall-2026',
  groupRekeyS: rekey,
  ...extra,
});

function leaf(
  key: string,
  name: string,
  neighbourhood: string,
  northM: number,
  eastM: number,
  host: string | null,
  apChannel: number,
  bhChannel: number,
  radio: Partial<DemoRadio> = {},
): DemoSite {
  return {
    key,
    name,
    neighbourhood,
    northM,
    eastM,
    groundElevationM: 8 + Math.round(Math.abs(northM) / 120),
    antennaHeightM: 6 + (key.length % 4),
    accessNotes: 'Ring the resident first; ladder access from the back yard.',
    host,
    node: {
      name: `lf-${key}`,
      hardware: 'Fallwright C5 outdoor CPE',
      firmware: DEMO_FIRMWARE,
      isUplink: false,
      reportIntervalS: MINUTE_REPORTERS.includes(key) ? 60 : REPORT_INTERVAL_S,
      radios: [
        backhaul('wlan0', 'backhaul-client', bhChannel, 16),
        ap(`Lindenfall-${name.split(' ')[0]}`, apChannel, 'wpa2-ccmp', 'lindenfall-shares-the-sky', radio),
      ],
    },
  };
}

function relay(
  key: string,
  name: string,
  neighbourhood: string,
  northM: number,
  eastM: number,
  host: string | null,
  upChannel: number,
  downChannel: number,
): DemoSite {
  return {
    key,
    name,
    neighbourhood,
    northM,
    eastM,
    groundElevationM: 12,
    antennaHeightM: 14,
    accessNotes: 'Roof hatch key with the caretaker; harness anchor by the chimney.',
    host,
    node: {
      name: `lf-${key}`,
      hardware: 'Fallwright R2 dual-radio rooftop router',
      firmware: DEMO_FIRMWARE,
      isUplink: false,
      reportIntervalS: REPORT_INTERVAL_S,
      radios: [
        backhaul('wlan0', 'backhaul-client', upChannel, 23),
        backhaul('wlan2', 'backhaul-ap', downChannel, 14),
        ap(`Lindenfall-${name.split(' ')[0]}`, 6),
      ],
    },
  };
}

export const SITES: DemoSite[] = [
  {
    key: 'granary',
    name: 'Granary Tower',
    neighbourhood: 'Old Quay',
    northM: 0,
    eastM: 0,
    groundElevationM: 10,
    antennaHeightM: 28,
    accessNotes: 'Uplink room on floor 6; the mast is on the roof. Two people for any mast work.',
    host: 'admin',
    node: {
      name: 'lf-granary',
      hardware: 'Fallwright H3 rack router, three sector radios',
      firmware: DEMO_FIRMWARE,
      isUplink: true,
      reportIntervalS: REPORT_INTERVAL_S,
      radios: [backhaul('wlan0', 'backhaul-ap', 36, 23), backhaul('wlan1', 'backhaul-ap', 100, 23), backhaul('wlan2', 'backhaul-ap', 116, 23)],
    },
  },
  relay('quay', 'Quay Chandlery', 'Old Quay', 900, -1200, 'host', 36, 52),
  relay('mill', 'Millbrook Mill', 'Millbrook', 150, 2100, 'h1', 100, 132),
  relay('marsh', 'Saltmarsh Water Tower', 'Saltmarsh Row', -2400, 300, 'h2', 116, 149),
  relay('chapel', 'Chapel Hill Bell Loft', 'Chapel Hill', 2900, -600, 'h3', 52, 60),
  leaf('harbourmaster', 'Harbourmaster Flats', 'Old Quay', 1250, -1500, null, 1, 52),
  leaf('netloft', 'Net Loft', 'Old Quay', 700, -1550, null, 11, 52, { encryption: 'none', preSharedKey: null, ssid: 'Lindenfall-Free' }),
  leaf('rope', 'Ropewalk 14', 'Old Quay', 1050, -900, 'h4', 6, 52),
  leaf('pier', 'Pier Cottages', 'Old Quay', 500, -1300, null, 1, 52, { encryption: 'wep', preSharedKey: '1234567890123' }),
  leaf('customs', 'Old Customs House', 'Old Quay', 1400, -1100, null, 11, 52),
  leaf('cooper', 'Cooperage Yard', 'Old Quay', 820, -1820, null, 6, 52),
  leaf('mill-race', 'Mill Race Terrace', 'Millbrook', 400, 2300, 'h5', 1, 132),
  leaf('weir', 'Weir House', 'Millbrook', -100, 2500, null, 11, 132, { encryption: 'wpa-tkip' }),
  leaf('tannery', 'Tannery Lofts', 'Millbrook', 250, 1750, null, 6, 132, { preSharedKey: 'password1' }),
  leaf('bakers', 'Bakers Row 3', 'Millbrook', 550, 2050, null, 1, 132),
  leaf('sluice', 'Sluice Gate Flats', 'Millbrook', -300, 2150, 'h6', 6, 132, { groupRekeyS: 0 }),
  leaf('granarylane', 'Granary Lane 9', 'Millbrook', 50, 2700, null, 11, 132),
  leaf('orchard', 'Orchard Close', 'Millbrook', 700, 2450, null, 6, 132),
  leaf('reed', 'Reedbed Bungalow', 'Saltmarsh Row', -2650, 100, 'h7', 1, 149),
  leaf('heron', 'Heron Walk 2', 'Saltmarsh Row', -2200, 600, null, 6, 149, { txPowerDbm: 20, antennaGainDbi: 8 }),
  leaf('tide', 'Tidegate Cottage', 'Saltmarsh Row', -2800, 450, null, 11, 149),
  leaf('samphire', 'Samphire Court', 'Saltmarsh Row', -2500, -150, null, 6, 149, { preSharedKey: 'Qx7!backhaul-of-lindenfall-2026' }),
  leaf('dyke', 'Dyke End', 'Saltmarsh Row', -3300, 700, null, 1, 149),
  leaf('brine', 'Brine Street 21', 'Saltmarsh Row', -2150, 50, null, 11, 149),
  leaf('belfry', 'Belfry Lane 5', 'Chapel Hill', 3150, -400, 'h8', 1, 60),
  leaf('glebe', 'Glebe Cottage', 'Chapel Hill', 3000, -950, null, 6, 60),
  leaf('yew', 'Yew Tree House', 'Chapel Hill', 2650, -350, 'host', 11, 60),
  leaf('lookout', 'Lookout Flats', 'Chapel Hill', 3400, -700, null, 6, 60),
  leaf('vicarage', 'Old Vicarage', 'Chapel Hill', 2750, -900, null, 1, 60),
];

const relayUp: Record<string, string> = { quay: 'wlan0', mill: 'wlan1', marsh: 'wlan2' };

/** Backhaul from the uplink to each relay (Chapel Hill hangs off Old Quay), then each relay to its leaves. */
export const LINKS: DemoLink[] = [
  ...Object.entries(relayUp).map(([relayKey, iface]): DemoLink => ({
    from: ['granary', iface],
    to: [relayKey, 'wlan0'],
    status: 'live',
    name: `Granary – ${relayKey}`,
  })),
  { from: ['quay', 'wlan2'], to: ['chapel', 'wlan0'], status: 'live', name: 'Quay – Chapel Hill' },
  ...SITES.filter((s) => s.node.radios[0].role === 'backhaul-client' && s.node.radios.length === 2).map((s): DemoLink => {
    const relayKey = { 'Old Quay': 'quay', Millbrook: 'mill', 'Saltmarsh Row': 'marsh', 'Chapel Hill': 'chapel' }[s.neighbourhood]!;
    return { from: [relayKey, 'wlan2'], to: [s.key, 'wlan0'], status: 'live', name: `${relayKey} – ${s.key}` };
  }),
];

/** Metres north/east of the town centre to degrees (small distances; spherical approximation is fine for a demo). */
export function offsetToLatLon(northM: number, eastM: number) {
  const metresPerDegLat = 111_320;
  return {
    latitude: TOWN.latitude + northM / metresPerDegLat,
    longitude: TOWN.longitude + eastM / (metresPerDegLat * Math.cos((TOWN.latitude * Math.PI) / 180)),
  };
}

/**
 * What the demo's routers do differently from the inventory, in history and in the simulator alike:
 * one backhaul antenna knocked slowly off its aim (measured signal well below prediction), one router
 * still on the previous firmware, and one access point a host moved to another channel by hand.
 */
export const DEMO_QUIRKS = {
  driftingNode: 'lf-heron',
  /** How far below its prediction the drifting link ends up, in dB. */
  driftDb: 17,
  firmware: { 'lf-dyke': 'Tilecrest 5.0.4' } as Record<string, string>,
  channels: { 'lf-weir': { wlan1: 6 } } as Record<string, Record<string, number>>,
  /** The simulator's node that drops for a few minutes now and then. */
  flakyNode: 'lf-tide',
};
