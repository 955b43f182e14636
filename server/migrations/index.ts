import * as m0001 from './0001-foundation';

/** Every migration in order. A new migration is a new file here and one line in this list. */
export const MIGRATIONS = [{ name: '0001-foundation', ...m0001 }];
