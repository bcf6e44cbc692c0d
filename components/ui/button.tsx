import clsx from 'clsx';
import Link from 'next/link';
import type { ComponentProps } from 'react';

type Variant = 'primary' | 'secondary' | 'danger' | 'quiet';

const variants: Record<Variant, string> = {
  primary: 'bg-charge-600 text-white hover:bg-charge-700 disabled:bg-charge-300',
  secondary: 'bg-paper-raised text-ink border border-paper-line hover:bg-paper-sunk disabled:text-ink-faint',
  danger: 'bg-fault-500 text-white hover:bg-fault-700 disabled:bg-fault-100',
  quiet: 'text-charge-700 hover:bg-charge-50 disabled:text-ink-faint',
};

const base =
  'inline-flex items-center justify-center gap-2 rounded-md px-4 py-2 text-sm font-bold transition-colors disabled:cursor-not-allowed min-h-10';

export function Button({ variant = 'primary', className, ...props }: ComponentProps<'button'> & { variant?: Variant }) {
  return <button className={clsx(base, variants[variant], className)} {...props} />;
}

export function ButtonLink({ variant = 'primary', className, ...props }: ComponentProps<typeof Link> & { variant?: Variant }) {
  return <Link className={clsx(base, variants[variant], className)} {...props} />;
}
