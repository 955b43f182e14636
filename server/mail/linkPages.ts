import escapeHtml from 'escape-html';

// The small pages behind the links in mail. They work without signing in and without the
// console's scripts; every value from the database is escaped.
export const esc = (s: string) => escapeHtml(s);

export function page(title: string, bodyHtml: string): string {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width,initial-scale=1">
<meta name="robots" content="noindex"><title>${esc(title)} · Parapet</title>
<style>body{font-family:'IBM Plex Sans',Arial,sans-serif;max-width:560px;margin:40px auto;padding:0 16px;color:#1f2933;line-height:1.5}
button{font:inherit;padding:8px 16px;border-radius:6px;border:1px solid #0b5f8a;background:#0b5f8a;color:#fff;cursor:pointer}
fieldset{border:1px solid #d5dae0;border-radius:6px;margin:12px 0}label{display:block;margin:4px 0}</style></head>
<body><h1 style="font-size:22px">${esc(title)}</h1>${bodyHtml}</body></html>`;
}

/** A form that posts the link's token back; GET never changes anything, so mail scanners that open links do no harm. */
export function confirmForm(action: string, token: string, button: string, inner = ''): string {
  return `<form method="post" action="${esc(action)}"><input type="hidden" name="t" value="${esc(token)}">${inner}<p><button type="submit">${esc(button)}</button></p></form>`;
}

export const radio = (name: string, value: string, label: string, checked: boolean) =>
  `<label><input type="radio" name="${esc(name)}" value="${esc(value)}"${checked ? ' checked' : ''}> ${esc(label)}</label>`;
export const checkbox = (name: string, label: string, checked: boolean) =>
  `<label><input type="checkbox" name="${esc(name)}" value="on"${checked ? ' checked' : ''}> ${esc(label)}</label>`;
export const timeInput = (name: string, label: string, value: string | null) =>
  `<label>${esc(label)} <input type="time" name="${esc(name)}" value="${esc(value ?? '')}"></label>`;
