import { describe, expect, it } from 'vitest';
import { auditDiff } from '../../server/services/auditDiff';

describe('audit diff', () => {
  it('keeps only the changed fields, without bookkeeping', () => {
    expect(auditDiff({ name: 'a', channel: 36, updatedAt: new Date(1) }, { name: 'a', channel: 44, updatedAt: new Date(2) })).toEqual({
      before: { channel: 36 },
      after: { channel: 44 },
    });
  });
  it('is null when nothing changed', () => {
    expect(auditDiff({ name: 'a', when: new Date(5) }, { name: 'a', when: new Date(5) })).toBeNull();
  });
  it('masks secrets but records that they changed', () => {
    expect(auditDiff({ preSharedKey: 'old-secret-key', passwordHash: null }, { preSharedKey: 'new-secret-key', passwordHash: '$argon2id$x' })).toEqual({
      before: { preSharedKey: '(hidden)', passwordHash: null },
      after: { preSharedKey: '(hidden)', passwordHash: '(hidden)' },
    });
  });
  it('a create has no before; a delete no after; ignored fields are left out', () => {
    expect(auditDiff(null, { id: 1, state: 'online', name: 'n' }, ['state'])).toEqual({ before: null, after: { id: 1, name: 'n' } });
    expect(auditDiff({ id: 1 }, null)).toEqual({ before: { id: 1 }, after: null });
  });
  it('compares JSON values and dates by content', () => {
    expect(auditDiff({ tags: [1, 2], at: new Date('2026-01-01T00:00:00Z') }, { tags: [1, 2], at: new Date('2026-01-01T00:00:00Z') })).toBeNull();
  });
});
