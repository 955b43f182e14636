import escapeHtml from 'escape-html';
import { headerText } from '../headerSafe';

// One description of a message gives both parts, so every database value is escaped in HTML by
// construction and the plain-text part always says the same thing.
export type Block =
  | { kind: 'p'; text: string }
  | { kind: 'h'; text: string }
  | { kind: 'ol' | 'ul'; items: string[] }
  | { kind: 'caution'; text: string }
  | { kind: 'facts'; rows: [string, string][] }
  | { kind: 'link'; label: string; url: string };

export interface Rendered {
  subject: string;
  text: string;
  html: string;
}

export interface FooterLinks {
  preferencesUrl: string;
  unsubscribeUrl: string;
}

const esc = (s: string) => escapeHtml(s);
const safeUrl = (u: string) => (/^https?:\/\//i.test(u) ? u : '#');

function blockText(b: Block): string {
  switch (b.kind) {
    case 'p':
      return b.text;
    case 'h':
      return b.text.toUpperCase();
    case 'ol':
      return b.items.map((item, i) => `${i + 1}. ${item}`).join('\n');
    case 'ul':
      return b.items.map((item) => `- ${item}`).join('\n');
    case 'caution':
      return `Safety: ${b.text}`;
    case 'facts':
      return b.rows.map(([k, v]) => `${k}: ${v}`).join('\n');
    case 'link':
      return `${b.label}: ${b.url}`;
  }
}

function blockHtml(b: Block): string {
  switch (b.kind) {
    case 'p':
      return `<p>${esc(b.text)}</p>`;
    case 'h':
      return `<h2 style="font-size:16px;margin:20px 0 6px">${esc(b.text)}</h2>`;
    case 'ol':
    case 'ul':
      return `<${b.kind}>${b.items.map((item) => `<li>${esc(item)}</li>`).join('')}</${b.kind}>`;
    case 'caution':
      return `<p style="border-left:4px solid #E69F00;padding:8px 12px;background:#fff7e6"><strong>Safety:</strong> ${esc(b.text)}</p>`;
    case 'facts':
      return `<table style="border-collapse:collapse">${b.rows.map(([k, v]) => `<tr><th style="text-align:left;padding:2px 12px 2px 0;font-weight:600">${esc(k)}</th><td>${esc(v)}</td></tr>`).join('')}</table>`;
    case 'link':
      return `<p><a href="${esc(safeUrl(b.url))}">${esc(b.label)}</a></p>`;
  }
}

/** Subject (one header-safe line), the plain-text part and the HTML part, with the preference and unsubscribe links. */
export function compose(subject: string, blocks: Block[], footer: FooterLinks): Rendered {
  const foot: Block[] = [
    { kind: 'p', text: 'You receive this because of your role in the community network. Choose what Parapet mails you:' },
    { kind: 'link', label: 'Your mail preferences', url: footer.preferencesUrl },
    { kind: 'link', label: 'Unsubscribe from all Parapet mail (one click, no sign-in)', url: footer.unsubscribeUrl },
  ];
  const text = [...blocks.map(blockText), '--', ...foot.map(blockText)].join('\n\n') + '\n';
  const html =
    '<!doctype html><html><body style="font-family:\'IBM Plex Sans\',Arial,sans-serif;font-size:15px;line-height:1.5;color:#1f2933;max-width:640px">' +
    blocks.map(blockHtml).join('\n') +
    '<hr style="border:none;border-top:1px solid #d5dae0;margin:24px 0 8px"><div style="font-size:13px;color:#52606d">' +
    foot.map(blockHtml).join('\n') +
    '</div></body></html>';
  return { subject: headerText(subject, 300), text, html };
}

/** A moment in the network's time zone, e.g. "Mon 1 Jun, 14:20 CEST"; falls back to UTC for an unknown zone. */
export function formatLocal(at: Date, timeZone: string): string {
  const opts: Intl.DateTimeFormatOptions = { weekday: 'short', day: 'numeric', month: 'short', hour: '2-digit', minute: '2-digit', timeZoneName: 'short' };
  try {
    return new Intl.DateTimeFormat('en-GB', { ...opts, timeZone }).format(at);
  } catch {
    return new Intl.DateTimeFormat('en-GB', { ...opts, timeZone: 'UTC' }).format(at);
  }
}

/** A duration in words people read at a glance: "45 s", "12 min", "3 h 20 min", "2 d 4 h". */
export function formatDuration(seconds: number): string {
  const s = Math.max(0, Math.round(seconds));
  if (s < 60) return `${s} s`;
  const min = Math.floor(s / 60);
  if (min < 60) return `${min} min`;
  const h = Math.floor(min / 60);
  if (h < 48) return min % 60 ? `${h} h ${min % 60} min` : `${h} h`;
  const d = Math.floor(h / 24);
  return h % 24 ? `${d} d ${h % 24} h` : `${d} d`;
}
