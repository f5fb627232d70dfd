/** Two sheets meeting square: a flat base and an upright, in the accent ink. */
export function BrandMark({ className }: { className?: string }) {
  return (
    <svg aria-hidden="true" viewBox="0 0 32 32" className={className}>
      <path d="M5 21 16 26.5 27 21 16 15.5Z" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinejoin="round" />
      <path d="M16 4.5v22" stroke="#1b5e73" strokeWidth="2.4" strokeLinecap="round" />
      <path d="M16 4.5 23.5 8.5v12.8" fill="none" stroke="#1b5e73" strokeWidth="1.8" strokeLinejoin="round" />
    </svg>
  );
}
