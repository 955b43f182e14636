import { describe, expect, it } from 'vitest';
import { headerText, isSafeAddress } from '../../../server/mail/headerSafe';
import { quietUntil } from '../../../server/mail/quietHours';
import { signLink, verifyLink } from '../../../server/mail/signedLinks';
import { compose, formatDuration } from '../../../server/mail/templates/compose';

const SECRET = 'a-test-secret-of-enough-length';
const now = new Date('2026-06-01T12:00:00Z');
const links = { preferencesUrl: 'http://p.example/p', unsubscribeUrl: 'http://p.example/u' };

describe('signed mail links', () => {
  const claims = { purpose: 'unsubscribe' as const, userId: 7, outageId: 0, expiresAtS: now.getTime() / 1000 + 60 };
  it('accepts its own link and returns the claims', () => {
    expect(verifyLink(SECRET, signLink(SECRET, claims), 'unsubscribe', now)).toEqual(claims);
  });
  it('refuses a changed id, a changed expiry, another purpose or another key with 400', () => {
    const token = signLink(SECRET, claims);
    for (const bad of [token.replace('.7.', '.8.'), token.replace(`.${claims.expiresAtS}.`, `.${claims.expiresAtS + 999}.`)]) {
      expect(() => verifyLink(SECRET, bad, 'unsubscribe', now)).toThrow(expect.objectContaining({ status: 400 }));
    }
    expect(() => verifyLink(SECRET, token, 'preferences', now)).toThrow(expect.objectContaining({ status: 400 }));
    expect(() => verifyLink('another-secret-entirely!', token, 'unsubscribe', now)).toThrow(expect.objectContaining({ status: 400 }));
  });
  it('refuses an expired link with 410', () => {
    expect(() => verifyLink(SECRET, signLink(SECRET, claims), 'unsubscribe', new Date(now.getTime() + 61_000))).toThrow(
      expect.objectContaining({ status: 410 }),
    );
  });
});

describe('header safety (RFC 5322 §2.2: a header line ends at CRLF)', () => {
  it('turns line breaks and controls into single spaces', () => {
    expect(headerText('Eve\r\nBcc: x@evil.test\t!')).toBe('Eve Bcc: x@evil.test !');
  });
  it('refuses addresses with line breaks, spaces or several @', () => {
    expect(isSafeAddress('host@lindenfall.example')).toBe(true);
    for (const bad of ['a@b.test\r\nBcc: c@d.test', 'a b@c.test', 'a@b@c.test', '<a@b.test>', 'nobody']) expect(isSafeAddress(bad)).toBe(false);
  });
});

describe('quiet hours (wall clock in the network time zone)', () => {
  it('delays to the end of a span that crosses midnight, and not outside it', () => {
    expect(quietUntil(new Date('2026-06-01T23:30:00Z'), 'UTC', '22:00', '07:00').toISOString()).toBe('2026-06-02T07:00:00.000Z');
    expect(quietUntil(new Date('2026-06-01T06:59:30Z'), 'UTC', '22:00', '07:00').toISOString()).toBe('2026-06-01T07:00:00.000Z');
    expect(quietUntil(new Date('2026-06-01T12:00:00Z'), 'UTC', '22:00', '07:00').toISOString()).toBe('2026-06-01T12:00:00.000Z');
  });
  it('reads the time zone: 21:30 UTC is 23:30 in Berlin in summer (CEST = UTC+2)', () => {
    expect(quietUntil(new Date('2026-06-01T21:30:00Z'), 'Europe/Berlin', '22:00', '07:00').toISOString()).toBe('2026-06-02T05:00:00.000Z');
  });
  it('sends at once without quiet hours', () => {
    expect(quietUntil(now, 'UTC', null, null)).toBe(now);
  });
});

describe('composed mail', () => {
  it('escapes database text in the HTML part and keeps the subject on one line', () => {
    const m = compose(
      'Node <x>\r\nBcc: y',
      [
        { kind: 'p', text: '<script>alert(1)</script> & "q"' },
        { kind: 'link', label: 'go', url: 'javascript:alert(1)' },
      ],
      links,
    );
    expect(m.subject).toBe('Node <x> Bcc: y');
    expect(m.html).toContain('&lt;script&gt;alert(1)&lt;/script&gt; &amp; &quot;q&quot;');
    expect(m.html).not.toContain('javascript:');
    expect(m.text).toContain('<script>alert(1)</script>'); // plain text is shown as text, never rendered
    expect(m.text).toContain('http://p.example/u');
  });
  it('words durations', () => {
    expect([45, 720, 12_000, 190_800].map(formatDuration)).toEqual(['45 s', '12 min', '3 h 20 min', '2 d 5 h']);
  });
});
