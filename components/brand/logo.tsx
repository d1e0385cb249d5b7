/** The Washproof mark: a droplet over a shield line, drawn by us. */
export function LogoMark({ className = "h-7 w-7" }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" className={className} aria-hidden="true" focusable="false">
      <rect x="1" y="1" width="30" height="30" rx="7" fill="#12524d" />
      <path
        d="M16 5.5c3.6 4.6 6.5 8.3 6.5 12a6.5 6.5 0 0 1-13 0c0-3.7 2.9-7.4 6.5-12z"
        fill="#eef7f6"
      />
      <path
        d="M12.4 18.2l2.5 2.5 4.8-5"
        fill="none"
        stroke="#12524d"
        strokeWidth="2"
        strokeLinecap="round"
        strokeLinejoin="round"
      />
      <path d="M6 26.5h20" stroke="#72b9b1" strokeWidth="1.6" strokeLinecap="round" />
    </svg>
  );
}

export function Logo() {
  return (
    <span className="flex items-center gap-2 font-semibold tracking-tight text-brand-800">
      <LogoMark />
      <span className="text-lg">Washproof</span>
    </span>
  );
}
