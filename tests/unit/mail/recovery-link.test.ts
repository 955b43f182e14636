import { describe, expect, it } from 'vitest';
import { hostStepText } from '../../../shared/health/hostSteps';
import { isGenuineLink, signLink } from '../../../server/mail/signedLinks';
import { hostOffline } from '../../../server/mail/templates/host';

const SECRET = 'a-test-secret-of-some-length';
const now = new Date('2026-06-01T12:00:00Z');
const claims = { purpose: 'recover' as const, userId: 7, outageId: 42, expiresAtS: Math.floor(now.getTime() / 1000) + 60 };

describe('the recovery link as a socket pass', () => {
  it('admits only a genuine, unexpired recover link', () => {
    const token = signLink(SECRET, claims);
    expect(isGenuineLink(SECRET, token, 'recover', now)).toBe(true);
    expect(isGenuineLink(SECRET, token.replace('.42.', '.43.'), 'recover', now)).toBe(false);
    expect(isGenuineLink(SECRET, signLink(SECRET, { ...claims, purpose: 'acknowledge' }), 'recover', now)).toBe(false);
    expect(isGenuineLink('another-secret-entirely!', token, 'recover', now)).toBe(false);
    expect(isGenuineLink(SECRET, token, 'recover', new Date(now.getTime() + 60_000))).toBe(false);
    expect(isGenuineLink(SECRET, undefined, 'recover', now)).toBe(false);
    expect(isGenuineLink(SECRET, ['x'], 'recover', now)).toBe(false);
  });
});

describe('host steps in words', () => {
  it('names who did what, with the note', () => {
    expect(hostStepText('restarted-router', 'Wren Albery (host)')).toBe('Wren Albery (host) restarted the router');
    expect(hostStepText('checked-power', 'Wren', '  socket was off ')).toBe('Wren checked the power: socket was off');
    expect(hostStepText('other', 'Wren', 'Checked the cable')).toBe('Wren checked the cable');
    expect(hostStepText('other', 'Wren', '')).toBe('Wren did something else');
  });
});

describe('the host outage mail', () => {
  it('carries the recovery link and keeps the safety caution', () => {
    const footer = { preferencesUrl: 'https://p.example/pref', unsubscribeUrl: 'https://p.example/unsub' };
    const mail = hostOffline(
      {
        recipientName: 'Wren',
        nodeName: 'lf-ropewalk',
        siteName: 'Ropewalk',
        neighbourhoodName: 'Old Quay',
        since: now,
        timeZone: 'UTC',
        operators: [],
        recoveryUrl: 'https://p.example/recover?t=abc',
      },
      footer,
    );
    expect(mail.text).toContain('https://p.example/recover?t=abc');
    expect(mail.html).toContain('href="https://p.example/recover?t=abc"');
    expect(mail.text).toMatch(/Safety: Do not climb onto the roof/);
  });
});
