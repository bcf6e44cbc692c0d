import Link from 'next/link';

export default function NotFound() {
  return (
    <main className="mx-auto max-w-xl px-4 py-24">
      <p className="font-mono text-sm text-ink-muted">404</p>
      <h1 className="mt-2">Nothing here</h1>
      <p className="mt-2 text-ink-muted">This page does not exist, or it belongs to someone else.</p>
      <Link href="/" className="mt-6 inline-block font-bold text-charge-700 underline">
        Back to your start page
      </Link>
    </main>
  );
}
