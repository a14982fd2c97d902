import { loamlineBrand } from '../config/brand';

export type LogoMarkProps = {
  /** Rendered width and height in CSS pixels. */
  size?: number;
  className?: string;
};

/**
 * The Loamline mark: two points above ground joined by a cable that runs through a trench below the
 * surface line. Decorative; put the product name in text beside it.
 */
export function LogoMark({ size = 32, className }: LogoMarkProps) {
  return (
    <svg
      className={className}
      width={size}
      height={size}
      viewBox="0 0 32 32"
      aria-hidden="true"
      focusable="false"
    >
      <defs>
        <clipPath id="loamline-mark-tile">
          <rect width="32" height="32" rx="7" />
        </clipPath>
      </defs>
      <g clipPath="url(#loamline-mark-tile)">
        <rect width="32" height="32" fill={loamlineBrand[60]} />
        <rect y="13" width="32" height="19" fill={loamlineBrand[40]} />
        <rect y="12" width="32" height="2" fill={loamlineBrand[130]} />
      </g>
      <path
        d="M9 8v12.5a3.5 3.5 0 0 0 3.5 3.5h7a3.5 3.5 0 0 0 3.5-3.5V8"
        fill="none"
        stroke={loamlineBrand[160]}
        strokeWidth="3.5"
        strokeLinecap="round"
      />
      <circle cx="9" cy="7" r="3.25" fill={loamlineBrand[160]} />
      <circle cx="23" cy="7" r="3.25" fill={loamlineBrand[160]} />
    </svg>
  );
}
