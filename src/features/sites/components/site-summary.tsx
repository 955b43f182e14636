import type { SiteDto } from '../../../../shared/schemas/site';
import { Details } from '../../../components/details';
import { formatDateTime } from '../../../lib/format';

export function SiteSummary({ site, neighbourhoodName }: { site: SiteDto; neighbourhoodName: string }) {
  const host = site.host;
  return (
    <Details
      items={[
        { label: 'Neighbourhood', value: neighbourhoodName },
        {
          label: 'Latitude, longitude',
          value: (
            <span className="tabular-nums">
              {site.latitude}, {site.longitude}
            </span>
          ),
        },
        { label: 'Ground elevation', value: `${site.groundElevationM} m` },
        { label: 'Antenna height above ground', value: `${site.antennaHeightM} m` },
        {
          label: 'Host',
          value: host ? (
            <>
              {host.name}
              {host.email && <span className="block text-muted">{host.email}</span>}
              {host.phone && <span className="block text-muted">{host.phone}</span>}
            </>
          ) : site.hostUserId ? (
            'Hosted (contact not shown to you)'
          ) : (
            'No host'
          ),
        },
        { label: 'Last changed', value: formatDateTime(site.updatedAt) },
        { label: 'Access notes', value: site.accessNotes ? <span className="whitespace-pre-line">{site.accessNotes}</span> : 'None' },
      ]}
    />
  );
}
