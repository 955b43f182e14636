import * as m0001 from './0001-foundation';
import * as m0002 from './0002-heartbeats';

/** Every migration in order. A new migration is a new file here and one line in this list. */
export const MIGRATIONS = [
  { name: '0001-foundation', ...m0001 },
  { name: '0002-heartbeats', ...m0002 },
];
