/** The tables whose changes the audit trail records (a light module: the history page's filter needs only this). */
export const AUDITED_TABLE_NAMES = ['sites', 'nodes', 'radios', 'links', 'neighbourhoods', 'users'] as const;
