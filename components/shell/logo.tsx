/**
 * Tidewright's mark: a breath drawn as one stroke — a rise, a plateau, a release back to baseline —
 * inside a rounded tile, with a warm dot where the patient's own effort starts the next breath.
 */
export function LogoMark({ size = 28, className }: { size?: number; className?: string }) {
  return (
    <svg
      width={size}
      height={size}
      viewBox="0 0 32 32"
      role="img"
      aria-label="Tidewright"
      className={className}
      xmlns="http://www.w3.org/2000/svg"
    >
      <rect x="1" y="1" width="30" height="30" rx="8" fill="#13232d" stroke="#2b4552" strokeWidth="1" />
      <path d="M4.5 21.5 H8 C10 21.5 10.4 10.5 13 10.5 H17.5 C19.6 10.5 20.4 21.5 23.5 21.5 H27.5" fill="none" stroke="#76b9ab" strokeWidth="2.6" strokeLinecap="round" strokeLinejoin="round" />
      <path d="M4.5 25.5 H27.5" stroke="#2b4552" strokeWidth="1.4" strokeLinecap="round" />
      <circle cx="8" cy="21.5" r="2.3" fill="#d7812e" />
    </svg>
  );
}

export function Logo({ className }: { className?: string }) {
  return (
    <span className={`inline-flex items-center gap-2 ${className ?? ""}`}>
      <LogoMark />
      <span className="text-[1.05rem] font-semibold tracking-tight">Tidewright</span>
    </span>
  );
}
