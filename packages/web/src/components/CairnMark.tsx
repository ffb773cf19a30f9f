/** Cairn's mark: four stacked stones, the top one ochre, a waymarker. */
export function CairnMark({ size = 28, title = 'Cairn' }: { size?: number; title?: string }) {
  return (
    <svg
      width={size}
      height={size}
      viewBox="0 0 32 32"
      role="img"
      aria-label={title}
      xmlns="http://www.w3.org/2000/svg"
    >
      <title>{title}</title>
      <rect width="32" height="32" rx="7" fill="var(--cairn-brand-700)" />
      <ellipse cx="16" cy="25" rx="10" ry="3.6" fill="var(--cairn-sand)" />
      <ellipse cx="16" cy="18.6" rx="7.6" ry="3.2" fill="var(--cairn-stone)" />
      <ellipse cx="16.6" cy="12.8" rx="5.4" ry="2.8" fill="var(--cairn-sand)" />
      <ellipse cx="15.8" cy="7.6" rx="3.4" ry="2.3" fill="var(--cairn-ochre)" />
    </svg>
  );
}
