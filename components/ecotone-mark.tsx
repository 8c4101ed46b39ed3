// Ecotone's mark: two habitats, reed and heath, meeting along a soft seam.
export function EcotoneMark({ className = "h-8 w-8" }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" className={className} aria-hidden="true" focusable="false">
      <rect width="32" height="32" rx="7" fill="#1b4a35" />
      <path d="M0 21 C 8 15, 13 25, 20 18 S 28 13, 32 15 V 32 H 0 Z" fill="#cf9030" />
      <path d="M0 21 C 8 15, 13 25, 20 18 S 28 13, 32 15" fill="none" stroke="#f8f5ec" strokeWidth="1.6" />
    </svg>
  );
}
