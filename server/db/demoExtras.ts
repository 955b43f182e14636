// What the planning and site pages show in the demo: a site survey per neighbourhood, drawn (not
// photographed) install pictures on two sites, an address plan with one clash, an upcoming
// maintenance window, and the mail choices of two people. All invented.
import { QueryTypes, type Sequelize } from 'sequelize';
import sharp from 'sharp';
import { parseSurveyCsv } from '../../shared/radio/surveyCsv';
import type { Config } from '../config';
import { MaintenanceWindow } from '../models';
import { Photo, usePhotoModel } from '../models/photo';
import { layoutSubnet } from '../services/addressPlans';
import { parseCidr } from '../../shared/addressing/cidr';
import { photoStore, preparePhoto } from '../services/photoStore';

/** Scans of nearby networks, one per neighbourhood, in Parapet's survey CSV layout. SSIDs are invented. */
export const DEMO_SURVEYS: { node: string; fileName: string; csv: string }[] = [
  {
    node: 'lf-rope',
    fileName: 'ropewalk-roof-scan.csv',
    csv:
      'ssid,channel,channelWidthMHz,signalDbm\nQuayside-Guest,6,20,-52\nChandlery-Till,6,20,-58\n' +
      'Harbour-Flats-2,6,40,-61\nNets&Floats,1,20,-79\nLoft-Printer,11,20,-83\n',
  },
  {
    node: 'lf-tannery',
    fileName: 'tannery-lofts-scan.csv',
    csv:
      'ssid,channel,channelWidthMHz,signalDbm\nMillrace-Home,6,20,-49\nBakehouse-Staff,6,20,-55\n' +
      'Tannery-3F,5,20,-60\nOrchardClose-7,11,20,-80\nMillbrook-School,36,40,-71\n',
  },
  {
    node: 'lf-reed',
    fileName: 'reedbed-scan.csv',
    csv: 'ssid,channel,channelWidthMHz,signalDbm\nMarshLight,1,20,-57\nHeronWalk-Home,1,20,-63\n' + 'Tidegate-Cottage,2,20,-66\nBrineSt-21,11,20,-84\n',
  },
  {
    node: 'lf-belfry',
    fileName: 'belfry-lane-scan.csv',
    csv:
      'ssid,channel,channelWidthMHz,signalDbm\nChapelHall-Guest,1,20,-54\nVicarage-Study,1,20,-61\n' +
      'Glebe-Garden,3,20,-68\nLookout-4,6,20,-82\nHillside-5G,44,80,-74\n',
  },
];

/** A schematic drawing of an install: sky, roofline, mast and antennas, with its caption. No real place is shown. */
function installDrawing(title: string, antennas: number, sky: string): Buffer {
  const dishes = Array.from({ length: antennas }, (_, i) => {
    const y = 150 + i * 70;
    return `<rect x="${i % 2 ? 420 : 330}" y="${y}" width="50" height="40" rx="6" fill="#e8e8e4" stroke="#4a4a48" stroke-width="3"/>
            <line x1="${i % 2 ? 420 : 380}" y1="${y + 20}" x2="400" y2="${y + 20}" stroke="#4a4a48" stroke-width="4"/>`;
  }).join('');
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="800" height="600" viewBox="0 0 800 600">
    <defs><linearGradient id="sky" x1="0" y1="0" x2="0" y2="1"><stop offset="0" stop-color="${sky}"/><stop offset="1" stop-color="#f4f1ea"/></linearGradient></defs>
    <rect width="800" height="600" fill="url(#sky)"/>
    <polygon points="0,470 180,400 360,470 360,600 0,600" fill="#8a6f5a"/>
    <rect x="360" y="430" width="440" height="170" fill="#9c8874"/>
    <rect x="395" y="90" width="10" height="380" fill="#5b5b58"/>
    ${dishes}
    <line x1="400" y1="470" x2="520" y2="560" stroke="#1f1f1e" stroke-width="3" stroke-dasharray="8 6"/>
    <text x="40" y="60" font-family="sans-serif" font-size="30" fill="#1f1f1e">${title}</text>
    <text x="40" y="95" font-family="sans-serif" font-size="18" fill="#3a3a38">Drawing for the demo, not a photograph</text>
  </svg>`;
  return Buffer.from(svg);
}

const DEMO_PHOTOS = [
  { site: 'Granary Tower', caption: 'Mast on the granary roof: three sector radios toward Quay, Mill and Marsh (drawing).', antennas: 3, sky: '#9cc3e4' },
  { site: 'Saltmarsh Water Tower', caption: 'Relay on the water tower rail after the surge arrester was replaced (drawing).', antennas: 2, sky: '#b9c9d6' },
];

export async function loadDemoExtras(sequelize: Sequelize, config: Config, people: Map<string, number>, now: Date) {
  const ids = new Map(
    (await sequelize.query<{ id: number; name: string }>('SELECT id, name FROM nodes', { type: QueryTypes.SELECT })).map((n) => [n.name, n.id]),
  );
  const operator = people.get('operator') ?? null;

  for (const [i, s] of DEMO_SURVEYS.entries()) {
    const parsed = parseSurveyCsv(s.csv);
    if (parsed.errors.length) throw new Error(`demo survey ${s.fileName}: ${parsed.errors[0].message}`);
    await sequelize.query('INSERT INTO site_surveys (node_id, file_name, uploaded_by, row_count, rows, created_at) VALUES ($1, $2, $3, $4, $5::jsonb, $6)', {
      bind: [ids.get(s.node), s.fileName, operator, parsed.rows.length, JSON.stringify(parsed.rows), new Date(now.getTime() - (6 + i) * 86_400_000)],
    });
  }

  usePhotoModel(sequelize);
  const store = photoStore(config.dataDir);
  for (const p of DEMO_PHOTOS) {
    const [site] = await sequelize.query<{ id: number }>('SELECT id FROM sites WHERE name = $1', { bind: [p.site], type: QueryTypes.SELECT });
    const bytes = await sharp(installDrawing(p.site, p.antennas, p.sky))
      .jpeg({ quality: 82 })
      .toBuffer();
    const prepared = await preparePhoto(bytes);
    const key = store.newKey();
    await store.write(key, bytes, prepared.thumbnail);
    await Photo.create({
      siteId: site.id,
      storageKey: key,
      contentType: prepared.contentType,
      sizeBytes: bytes.length,
      widthPx: prepared.widthPx,
      heightPx: prepared.heightPx,
      hasThumbnail: true,
      caption: p.caption,
      uploadedBy: operator,
    });
  }

  // Every node gets its /24 out of the pool (gateway = its management address); one hand-typed /23 overlaps a neighbour.
  const nodes = await sequelize.query<{ id: number; name: string; managementAddress: string }>(
    'SELECT id, name, management_address AS "managementAddress" FROM nodes ORDER BY id',
    { type: QueryTypes.SELECT },
  );
  for (const n of nodes) {
    const third = Number(n.managementAddress.split('.')[2]);
    const cidr = n.name === 'lf-tannery' ? `10.64.${third}.0/23` : `10.64.${third}.0/24`;
    const l = layoutSubnet(parseCidr(cidr));
    await sequelize.query('INSERT INTO node_address_plans (node_id, cidr, gateway, dhcp_start, dhcp_end) VALUES ($1, $2, $3, $4, $5)', {
      bind: [n.id, l.cidr, l.gateway, l.dhcpStart, l.dhcpEnd],
    });
  }

  // The demo host has announced a power-off for next week, so the host portal and the node show one ahead.
  const nextWeek = new Date(Math.floor(now.getTime() / 3_600_000) * 3_600_000 + 5 * 86_400_000 + 9 * 3_600_000);
  await MaintenanceWindow.create({
    nodeId: ids.get('lf-yew')!,
    startsAt: nextWeek,
    endsAt: new Date(nextWeek.getTime() + 3 * 3_600_000),
    reason: 'An electrician is rewiring the attic; the router will be unplugged.',
    createdBy: people.get('host') ?? null,
  });

  // The host behind the water tower asked to hear about trouble upstream (set before the history replays, so the failure tells her).
  await sequelize.query(
    'INSERT INTO alert_preferences (user_id, upstream_notices) VALUES ($1, true) ON CONFLICT (user_id) DO UPDATE SET upstream_notices = true',
    { bind: [people.get('h7')] },
  );
}
