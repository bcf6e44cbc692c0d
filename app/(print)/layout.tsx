import { requireUser } from '@/lib/auth/session';

/** Pages meant for paper: no navigation, A4 margins when printed. */
export default async function PrintLayout({ children }: { children: React.ReactNode }) {
  await requireUser();
  return (
    <div className="min-h-screen bg-paper-raised print:bg-white">
      <style>{'@page { size: A4; margin: 14mm; } @media print { body { background: #fff; } .print-avoid-break { break-inside: avoid; } }'}</style>
      <main className="mx-auto max-w-4xl px-6 py-8 print:max-w-none print:p-0">{children}</main>
    </div>
  );
}
