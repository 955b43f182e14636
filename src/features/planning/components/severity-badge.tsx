import type { Severity } from '../../../../shared/security/review';

// Colour-blind-safe colours, always with a shape and the word.
const LOOK: Record<Severity, { colour: string; shape: string }> = {
  critical: { colour: '#D55E00', shape: '■' },
  high: { colour: '#E69F00', shape: '▲' },
  medium: { colour: '#0072B2', shape: '◆' },
  low: { colour: '#8a8f93', shape: '○' },
};

export function SeverityBadge({ severity }: { severity: Severity }) {
  const look = LOOK[severity];
  return (
    <span className="inline-flex items-center gap-1 rounded border px-1.5 py-0.5 text-xs font-semibold uppercase" style={{ borderColor: look.colour }}>
      <span aria-hidden="true" style={{ color: look.colour }}>{look.shape}</span>
      {severity}
    </span>
  );
}
