import { describe, expect, it } from 'vitest';
import { countStates, outageSentence, statusSentence } from '../../../shared/health/publicWords';

describe('public status words', () => {
  it('counts online, degraded and maintenance as up, offline and stranded as down, unknown apart', () => {
    expect(countStates(['online', 'degraded', 'maintenance', 'offline', 'stranded', 'unknown'])).toEqual({ total: 6, up: 3, down: 2, unknown: 1 });
  });

  it.each([
    [{ total: 9, up: 9, down: 0, unknown: 0 }, null, '9 of 9 nodes up.'],
    [{ total: 1, up: 1, down: 0, unknown: 0 }, null, '1 of 1 node up.'],
    [{ total: 8, up: 6, down: 2, unknown: 0 }, '14:20', '2 of 8 down since 14:20.'],
    [{ total: 8, up: 5, down: 2, unknown: 1 }, '14:20', '2 of 8 down since 14:20; 1 not heard from yet.'],
    [{ total: 4, up: 3, down: 0, unknown: 1 }, null, '3 of 4 nodes up; 1 not heard from yet.'],
    [{ total: 0, up: 0, down: 0, unknown: 0 }, null, 'No nodes here yet.'],
  ])('says %j as a plain sentence', (counts, since, sentence) => {
    expect(statusSentence(counts, since)).toBe(sentence);
  });

  it('describes an outage by kind of node and neighbourhood only', () => {
    expect(outageSentence({ neighbourhood: 'Old Quay', state: 'offline', isUplink: false, sinceClock: '14:20' })).toBe(
      'A rooftop node in Old Quay has been down since 14:20.',
    );
    expect(outageSentence({ neighbourhood: 'Old Quay', state: 'offline', isUplink: true, sinceClock: '9 Mar, 08:00' })).toBe(
      'The node that carries the internet uplink in Old Quay has been down since 9 Mar, 08:00.',
    );
    expect(outageSentence({ neighbourhood: 'Millbrook', state: 'stranded', isUplink: false, sinceClock: '14:20' })).toMatch(
      /cut off since 14:20, because a link further up/,
    );
  });
});
