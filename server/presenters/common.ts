export const iso = (d: Date | null | undefined): string | null => (d ? new Date(d).toISOString() : null);
