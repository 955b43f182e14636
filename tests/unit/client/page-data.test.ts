import { describe, expect, it } from 'vitest';
import { dataUrl, pageData, reportMonth } from '../../../src/app/page-data';
import { paths } from '../../../src/lib/paths';

describe('the reports page’s first request', () => {
  it('is the month its address names, else the last whole month (December of the year before in January)', () => {
    expect(reportMonth(new URLSearchParams('month=2026-03'), new Date('2026-12-03T06:00:00Z'))).toBe('2026-03');
    expect(reportMonth(new URLSearchParams(), new Date('2026-12-03T06:00:00Z'))).toBe('2026-11');
    expect(reportMonth(new URLSearchParams(), new Date('2027-01-01T00:00:00Z'))).toBe('2026-12');
    // Anything but YYYY-MM is ignored, as the page ignores it.
    expect(reportMonth(new URLSearchParams('month=2026-3'), new Date('2026-12-03T06:00:00Z'))).toBe('2026-11');
    expect(reportMonth(new URLSearchParams('month=%22%3E'), new Date('2026-12-03T06:00:00Z'))).toBe('2026-11');
  });

  it('is preloaded at the URL the page fetches', () => {
    expect(pageData[paths.reports.pattern](new URLSearchParams('month=2026-03')).map(dataUrl)).toEqual(['/api/v1/reports/availability?month=2026-03']);
  });
});
