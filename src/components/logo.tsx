/** The Sparkwright mark: a bolt on a slate tile. */
export function Logo({ size = 32 }: { size?: number }) {
  return (
    <svg width={size} height={size} viewBox="0 0 64 64" aria-hidden focusable="false">
      <rect width="64" height="64" rx="14" fill="#2b3440" />
      <path d="M36 6 L18 36 H30 L26 58 L46 26 H34 Z" fill="#f08a24" stroke="#fff3e0" strokeWidth="2" strokeLinejoin="round" />
    </svg>
  );
}
