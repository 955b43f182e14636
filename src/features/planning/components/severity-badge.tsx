import type { Severity } from '../../../../shared/security/review';

// Colour tokens that keep 4.5:1 on the surface in both themes (src/styles.css), always with a shape and the word.
const LOOK: Record<Severity, { colour: string; shape: string }> = {
  critical: { colour: 'var(--pp-danger)', shape: '■' },
  high: { colour: 'var(--pp-caution)', shape: '▲' },
  medium: { colour: 'var(--pp-info)', shape: '◆' },
  low: { colour: 'var(--pp-muted)', shape: '○' },
};

export function SeverityBadge({ severity }: { severity: Severity }) {
  const look = LOOK[severity];
  return (
    <span className="inline-flex items-center gap-1 rounded border px-1.5 py-0.5 text-xs font-semibold uppercase" style={{ borderColor: look.colour }}>
      <span aria-hidden="true" style={{ color: look.colour }}>
        {look.shape}
      </span>
      {severity}
    </span>
  );
}
