import * as m0001 from './0001-foundation';
import * as m0002 from './0002-heartbeats';
import * as m0003 from './0003-outage-views';

/** Every migration in order. A new migration is a new file here and one line in this list. */
export const MIGRATIONS = [
  { name: '0001-foundation', ...m0001 },
  { name: '0002-heartbeats', ...m0002 },
  { name: '0003-outage-views', ...m0003 },
];
