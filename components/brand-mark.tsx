/** VisViva's mark: an eccentric orbit with its focus and a craft at periapsis. */
export function BrandMark({ className = "h-7 w-7" }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" className={className} aria-hidden="true">
      <ellipse cx="18" cy="16" rx="12" ry="8" fill="none" stroke="currentColor" strokeWidth="2" transform="rotate(-24 18 16)" />
      <circle cx="12.5" cy="18.2" r="3" fill="currentColor" />
      <circle cx="6.6" cy="21.2" r="2" className="fill-drift-500" />
    </svg>
  );
}
