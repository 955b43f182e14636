import * as m0001 from './0001-foundation';
import * as m0002 from './0002-heartbeats';
import * as m0003 from './0003-outage-views';
import * as m0004 from './0004-alerts';
import * as m0005 from './0005-planning';
import * as m0006 from './0006-photos-reports';
import * as m0007 from './0007-topology-outages';
import * as m0008 from './0008-people';
import * as m0010 from './0010-boot-ids';
import * as m0013 from './0013-terrain-tiles';
import * as m0015 from './0015-air-and-host-steps';
import * as m0016 from './0016-one-row-per-report';
import * as m0017 from './0017-store-function';
import * as m0018 from './0018-store-by-node-index';
import * as m0019 from './0019-ingest-change-notices';

/** Every migration in order. A new migration is a new file here and one line in this list. */
export const MIGRATIONS = [
  { name: '0001-foundation', ...m0001 },
  { name: '0002-heartbeats', ...m0002 },
  { name: '0003-outage-views', ...m0003 },
  { name: '0004-alerts', ...m0004 },
  { name: '0005-planning', ...m0005 },
  { name: '0006-photos-reports', ...m0006 },
  { name: '0007-topology-outages', ...m0007 },
  { name: '0008-people', ...m0008 },
  { name: '0010-boot-ids', ...m0010 },
  { name: '0013-terrain-tiles', ...m0013 },
  { name: '0015-air-and-host-steps', ...m0015 },
  { name: '0016-one-row-per-report', ...m0016 },
  { name: '0017-store-function', ...m0017 },
  { name: '0018-store-by-node-index', ...m0018 },
  { name: '0019-ingest-change-notices', ...m0019 },
];
