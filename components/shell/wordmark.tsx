export function Wordmark({ inverted = false }: { inverted?: boolean }) {
  return (
    <span className={`inline-flex items-center gap-2 font-bold tracking-tight ${inverted ? 'text-paper' : 'text-ink'}`}>
      <svg width="26" height="26" viewBox="0 0 26 26" aria-hidden>
        <rect x="1" y="1" width="24" height="24" rx="6" className={inverted ? 'fill-charge-500' : 'fill-charge-600'} />
        <path d="M5 19 C 8 8, 12 6, 15 9 S 19 16, 21 17" fill="none" stroke="white" strokeWidth="2.2" strokeLinecap="round" />
      </svg>
      <span className="text-lg">Loadproof</span>
    </span>
  );
}
