/** Parapet's mark: a roofline with a signal over it. Its own file, so signed-out pages need not load the console's shell. */
export function ParapetMark({ size = 28 }: { size?: number }) {
  return (
    <svg width={size} height={size} viewBox="0 0 32 32" aria-hidden="true">
      <rect width="32" height="32" rx="7" className="fill-accent" />
      <path d="M6 27V17h4v3h3v-3h6v3h3v-3h4v10z" className="fill-accent-ink" />
      <path d="M11.5 11.5a6.4 6.4 0 0 1 9 0" fill="none" strokeWidth="2.2" strokeLinecap="round" className="stroke-accent-ink" />
      <path d="M8.4 8.4a10.8 10.8 0 0 1 15.2 0" fill="none" strokeWidth="2.2" strokeLinecap="round" opacity=".7" className="stroke-accent-ink" />
      <circle cx="16" cy="14.6" r="1.7" className="fill-accent-ink" />
    </svg>
  );
}
