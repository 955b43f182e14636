import { describe, expect, it } from 'vitest';
import type { Actor } from '../../../server/policies/actor';
import { linkScopeSql } from '../../../server/policies/link';
import { nodeScopeSql } from '../../../server/policies/node';
import { column, intArray } from '../../../server/policies/scopeSql';

const actor = (over: Partial<Actor>): Actor => ({
  id: 7,
  email: 'p@example.test',
  name: 'P',
  role: 'host',
  neighbourhoodIds: [],
  hostedSiteIds: [],
  hostedNeighbourhoodIds: [],
  ...over,
});

describe('raw-SQL scope builders', () => {
  it('write ids as an integer array literal and refuse anything else, so no text reaches the SQL', () => {
    expect(intArray([3, 14])).toBe("'{3,14}'::int[]");
    expect(intArray([])).toBe("'{}'::int[]");
    expect(() => intArray([1.5])).toThrow(/not an integer/);
    expect(() => intArray([Number('1); DROP TABLE nodes; --')])).toThrow(/not an integer/);
  });
  it('accept only identifiers as aliases and columns', () => {
    expect(column('n', 'site_id')).toBe('n.site_id');
    expect(column('', 'site_id')).toBe('site_id');
    expect(() => column('n; DELETE FROM nodes', 'site_id')).toThrow(/not a column/);
  });
  it('give admins everything, nobody-in-particular nothing, and others their neighbourhoods and hosted sites', () => {
    expect(nodeScopeSql(actor({ role: 'admin' }))).toBe('true');
    expect(nodeScopeSql(actor({}))).toBe('false');
    expect(nodeScopeSql(actor({ hostedSiteIds: [4] }), 'x')).toBe("(x.site_id = ANY('{4}'::int[]))");
    expect(nodeScopeSql(actor({ role: 'operator', neighbourhoodIds: [2], hostedSiteIds: [4] }))).toBe(
      "(n.site_id = ANY('{4}'::int[]) OR n.neighbourhood_id = ANY('{2}'::int[]))",
    );
    // A host's leftover neighbourhood ids (from an earlier role) never count: only operators operate.
    expect(nodeScopeSql(actor({ role: 'host', neighbourhoodIds: [2] }))).toBe('false');
    expect(linkScopeSql(actor({ hostedSiteIds: [4] }))).toBe('false');
    expect(linkScopeSql(actor({ role: 'operator', neighbourhoodIds: [2] }))).toBe(
      "(na.neighbourhood_id = ANY('{2}'::int[]) OR nb.neighbourhood_id = ANY('{2}'::int[]))",
    );
  });
});
