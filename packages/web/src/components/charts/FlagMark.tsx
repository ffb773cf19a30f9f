import { type FlagLike, flagKind, flagPaint, flagPath, flagShortText, flagText } from './flags';

/** The flag's shape on its own (for charts and legends); hidden from screen readers. */
export function FlagShape({ flag, size = 12 }: { flag: FlagLike | null; size?: number }) {
  const kind = flagKind(flag);
  const paint = flagPaint(kind);
  const box = size + 4;
  return (
    <svg
      className="cairn-flag-shape"
      width={box}
      height={box}
      viewBox={`${-box / 2} ${-box / 2} ${box} ${box}`}
      aria-hidden="true"
      focusable="false"
    >
      <path d={flagPath(kind, size)} fill={paint.fill} stroke={paint.stroke} strokeWidth={1.8} />
    </svg>
  );
}

/** A flag in words and shape: "▲ Outlier, better", with the full sentence as its title. */
export function FlagMark({ flag, long = false }: { flag: FlagLike | null; long?: boolean }) {
  const kind = flagKind(flag);
  return (
    <span className={`cairn-flag cairn-flag-${kind}`} title={flagText(flag)}>
      <FlagShape flag={flag} />
      <span>{long ? flagText(flag) : flagShortText(flag)}</span>
    </span>
  );
}

const legendKinds: { flag: FlagLike; text: string }[] = [
  { flag: { band: 'within', side: null, assessment: null }, text: 'Within the 95 % limits' },
  {
    flag: { band: 'notable', side: 'above', assessment: 'better' },
    text: 'Beyond 95 %, better (outline, points up)',
  },
  {
    flag: { band: 'outlier', side: 'above', assessment: 'better' },
    text: 'Beyond 99.8 %, better (filled, points up)',
  },
  {
    flag: { band: 'notable', side: 'below', assessment: 'worse' },
    text: 'Beyond 95 %, worse (outline, points down)',
  },
  {
    flag: { band: 'outlier', side: 'below', assessment: 'worse' },
    text: 'Beyond 99.8 %, worse (filled, points down)',
  },
];

/** What each shape means. */
export function FlagLegend() {
  return (
    <ul className="cairn-flag-legend" aria-label="Flag shapes">
      {legendKinds.map(({ flag, text }) => (
        <li key={text}>
          <FlagShape flag={flag} /> {text}
        </li>
      ))}
    </ul>
  );
}
