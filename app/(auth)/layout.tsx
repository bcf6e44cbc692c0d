import { Wordmark } from '@/components/shell/wordmark';

export default function AuthLayout({ children }: { children: React.ReactNode }) {
  return (
    <div className="grid min-h-screen md:grid-cols-[minmax(0,5fr)_minmax(0,6fr)]">
      <aside className="relative hidden flex-col justify-between overflow-hidden bg-ink p-10 text-paper md:flex">
        <Wordmark inverted />
        <div>
          <p className="text-3xl font-bold leading-tight">
            Warranty claims that
            <br />
            carry their own proof.
          </p>
          <p className="mt-4 max-w-sm text-paper/70">
            Photos, proof of purchase and a load test before and after the repair — from the shop’s bench to the brand’s
            decision, the replacement and the credit.
          </p>
        </div>
        <svg viewBox="0 0 400 160" className="w-full text-charge-400" aria-hidden>
          <g stroke="currentColor" strokeOpacity="0.15">
            {[20, 60, 100, 140].map((y) => (
              <line key={y} x1="0" x2="400" y1={y} y2={y} />
            ))}
          </g>
          <path d="M0 150 C 60 40, 120 20, 180 30 S 300 90, 400 120" fill="none" stroke="currentColor" strokeWidth="3" />
          <path d="M0 150 C 60 60, 120 45, 180 52 S 300 110, 400 135" fill="none" stroke="#f8c555" strokeWidth="2" strokeDasharray="6 6" />
        </svg>
      </aside>
      <main className="flex items-center justify-center p-6">
        <div className="w-full max-w-sm">
          <div className="mb-8 md:hidden">
            <Wordmark />
          </div>
          {children}
        </div>
      </main>
    </div>
  );
}
