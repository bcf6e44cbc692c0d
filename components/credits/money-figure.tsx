import clsx from 'clsx';
import { money } from './labels';

export function MoneyFigure({ minor, currency, className, strong }: { minor: number; currency: string; className?: string; strong?: boolean }) {
  return <span className={clsx('figure whitespace-nowrap', minor < 0 && 'text-fault-700', strong && 'font-bold', className)}>{money(minor, currency)}</span>;
}
