import { describe, expect, it } from 'vitest';
import { hostSummary } from '../../../shared/health/hostWords';

describe('host health sentence', () => {
  const base = { siteName: 'Quay Chandlery', lastSeenClock: '14:20', sinceClock: '14:25' };
  it.each([
    ['online', 'Your node on Quay Chandlery is working normally.'],
    ['offline', 'Your node on Quay Chandlery has not reported since 14:20; the operators have been told.'],
    [
      'degraded',
      'Your node on Quay Chandlery is working, but its signal or speed has been weaker than it should be since 14:25; ' +
        'the operators can see this and will look into it.',
    ],
    ['maintenance', 'Your node on Quay Chandlery is in an announced power-off or maintenance window; no one is alerted while it lasts.'],
    ['unknown', 'Your node on Quay Chandlery has not reported yet. Once it is installed and powered, it will show here within a few minutes.'],
  ] as const)('%s', (state, sentence) => {
    expect(hostSummary({ ...base, state })).toBe(sentence);
  });

  it('never asks the host to check their own power when the fault is upstream', () => {
    const s = hostSummary({ ...base, state: 'stranded' });
    expect(s).toContain('Nothing needs checking at your end');
    expect(s).not.toMatch(/power|plug|cable/i);
  });

  it('offline without a last report still reads as a sentence', () => {
    expect(hostSummary({ ...base, state: 'offline', lastSeenClock: null })).toBe('Your node on Quay Chandlery is not reporting; the operators have been told.');
  });
});
