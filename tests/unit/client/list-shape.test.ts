import { afterEach, describe, expect, it, vi } from 'vitest';
import { checkListShape } from '../../../src/lib/query-client';
import { siteKeys } from '../../../src/lib/query-keys';

describe('one query key, one shape', () => {
  afterEach(() => vi.restoreAllMocks());
  const envelope = { data: [{ id: 1, name: 'Granary Tower' }], pagination: { page: 1, pageSize: 500, total: 1 } };

  it('accepts the list envelope under a list key, and leaves other keys alone', () => {
    const error = vi.spyOn(console, 'error').mockImplementation(() => {});
    expect(checkListShape(envelope, { queryKey: siteKeys.list({ page: 1, pageSize: 500, sort: 'name' }) })).toBe(true);
    expect(checkListShape({ id: 1 }, { queryKey: siteKeys.detail(1) })).toBe(true);
    expect(error).not.toHaveBeenCalled();
  });

  it('reports a bare array stored under a list key (what crashed the channel plan after a node page)', () => {
    const error = vi.spyOn(console, 'error').mockImplementation(() => {});
    expect(checkListShape(envelope.data, { queryKey: siteKeys.list({ page: 1, pageSize: 500, sort: 'name' }) })).toBe(false);
    expect(error).toHaveBeenCalledWith(expect.stringMatching(/\["sites","list".*holds something other than a list envelope/));
    expect(checkListShape(null, { queryKey: siteKeys.list({}) })).toBe(false);
    expect(checkListShape({ data: [] }, { queryKey: siteKeys.list({}) })).toBe(false);
  });
});
