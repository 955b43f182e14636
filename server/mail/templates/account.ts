import escapeHtml from 'escape-html';
import { headerText } from '../headerSafe';
import type { Rendered } from './compose';

// Account mail is transactional: no preference or unsubscribe footer (a person asked for it, or an
// admin asked on their behalf), and every value is escaped in the HTML part.
function render(subject: string, paragraphs: string[], link: { label: string; url: string }, after: string[]): Rendered {
  const text = [...paragraphs, `${link.label}:\n${link.url}`, ...after].join('\n\n') + '\n';
  const p = (t: string) => `<p>${escapeHtml(t)}</p>`;
  const html =
    '<!doctype html><html><body style="font-family:\'IBM Plex Sans\',Arial,sans-serif;font-size:15px;line-height:1.5;color:#1f2933;max-width:640px">' +
    paragraphs.map(p).join('\n') +
    `<p><a href="${escapeHtml(link.url)}">${escapeHtml(link.label)}</a></p>` +
    after.map(p).join('\n') +
    '</body></html>';
  return { subject: headerText(subject, 300), text, html };
}

const roleWords = { admin: 'a coordinator (admin)', operator: 'an operator', host: 'a host' } as const;

export function invitationMail(f: { name: string; invitedBy: string; role: keyof typeof roleWords; url: string; expiresAt: string }): Rendered {
  return render(
    'You are invited to Parapet, the community network console',
    [
      `Hello ${f.name},`,
      `${f.invitedBy} has invited you to Parapet, the console of the community network, as ${roleWords[f.role]}.`,
      'Open the link below and choose a password (at least 12 characters; a few unrelated words work well). The link works once.',
    ],
    { label: 'Accept the invitation and choose a password', url: f.url },
    [`The link expires ${f.expiresAt}. If you did not expect this message, ignore it; nothing happens until the link is used.`],
  );
}

export function passwordResetMail(f: { name: string; url: string; expiresAt: string }): Rendered {
  return render(
    'Choose a new Parapet password',
    [
      `Hello ${f.name},`,
      'Someone (we hope you) asked to reset the password of your Parapet account. Open the link below to choose a new one. The link works once.',
    ],
    { label: 'Choose a new password', url: f.url },
    [`The link expires ${f.expiresAt}. If you did not ask for this, ignore this message; your password stays as it is.`],
  );
}
