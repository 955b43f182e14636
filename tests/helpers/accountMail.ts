import { QueryTypes, type Sequelize } from 'sequelize';

/** The account mails written to the outbox for an address, newest last, with the token from their link. */
export async function accountMails(sequelize: Sequelize, address: string, kind: 'invitation' | 'password-reset') {
  const rows = await sequelize.query<{ subject: string; text_body: string; html_body: string; recipient_user_id: number | null }>(
    `SELECT subject, text_body, html_body, recipient_user_id FROM outbox WHERE recipient_address = $1 AND kind = $2 ORDER BY id`,
    { bind: [address, kind], type: QueryTypes.SELECT },
  );
  return rows.map((r) => ({ ...r, token: tokenIn(r.text_body) }));
}

export function tokenIn(text: string): string {
  const m = /\/(?:invite|reset)\/([A-Za-z0-9._-]+)/.exec(text);
  if (!m) throw new Error(`no account link in: ${text}`);
  return m[1];
}

/** The same token with one character of its signature changed. */
export const tampered = (token: string) => token.slice(0, -1) + (token.endsWith('A') ? 'B' : 'A');
