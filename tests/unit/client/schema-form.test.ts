import { describe, expect, it, vi } from 'vitest';
import { z } from 'zod';
import { siteCreateSchema } from '../../../shared/schemas/site';
import { lazySchema, optionalText, placeIssues, schemaIssues, toIdOrNull, toNumber } from '../../../src/lib/schema-form';

describe('text from a field as the API takes it', () => {
  it('reads numbers with a decimal point or comma, and blank as not given', () => {
    expect(toNumber(' 52.0702 ')).toBe(52.0702);
    expect(toNumber('4,3007')).toBe(4.3007);
    expect(toNumber('')).toBeUndefined();
    expect(toNumber('   ')).toBeUndefined();
    expect(toNumber('abc')).toBeNaN();
  });

  it('reads a blank select as null and blank optional text as left out', () => {
    expect(toIdOrNull('')).toBeNull();
    expect(toIdOrNull('17')).toBe(17);
    expect(optionalText('  ')).toBeUndefined();
    expect(optionalText('Quay')).toBe('Quay');
  });
});

describe('schema issues placed on the form', () => {
  it('words a left-out field "is required" and keeps the schema’s own message otherwise', () => {
    const input = { name: 'Quay Chandlery', neighbourhoodId: undefined, latitude: 91, longitude: toNumber('4.3x') };
    const result = siteCreateSchema.safeParse(input);
    expect(result.success).toBe(false);
    const issues = schemaIssues(result.success ? [] : result.error.issues, input);
    expect(issues.find((i) => i.path === 'neighbourhoodId')?.message).toBe('is required');
    // The shared schema's own words (shared/schemas/site.ts), as the API sends them.
    expect(issues.find((i) => i.path === 'latitude')?.message).toBe('must be between -90 and 90');
    // Typed but not a number: the schema's "must be a number", not "is required".
    expect(issues.find((i) => i.path === 'longitude')?.message).toBe('must be a number');
  });

  it('joins one field’s messages and moves issues with no field of the form into the form message, with their path', () => {
    const placed = placeIssues(
      [
        { path: 'name', message: 'is too short' },
        { path: 'name', message: 'has a character that is not allowed' },
        { path: 'radios.0.channel', message: 'is not allowed in this region' },
        { path: '', message: 'the two ends are the same radio' },
      ],
      ['name', 'status'],
      'Some fields need attention.',
    );
    expect(placed.fields).toEqual({ name: 'is too short has a character that is not allowed' });
    expect(placed.formError).toBe('Some fields need attention. radios.0.channel: is not allowed in this region the two ends are the same radio');
  });
});

describe('a schema fetched on first use', () => {
  it('loads once, and tries again after a failed load', async () => {
    const schema = z.object({ email: z.string() });
    const load = vi.fn<() => Promise<typeof schema>>().mockRejectedValueOnce(new Error('offline')).mockResolvedValue(schema);
    const get = lazySchema(load);
    await expect(get()).rejects.toThrow('offline');
    expect(await get()).toBe(schema);
    expect(await get()).toBe(schema);
    expect(load).toHaveBeenCalledTimes(2);
  });
});
