import { Badge } from '@/components/ui/badge';

const TONES: Record<string, 'neutral' | 'charge' | 'volt' | 'fault' | 'cell'> = {
  draft: 'neutral', submitted: 'cell', in_review: 'cell', waiting_on_dealer: 'volt', appealed: 'volt', denied: 'fault',
  withdrawn: 'neutral', approved: 'charge', credit_pending: 'charge', credited: 'charge', reconciled: 'neutral',
};

export function StageBadge({ stage, label }: { stage: string; label: string }) {
  return <Badge tone={TONES[stage] ?? 'neutral'}>{label}</Badge>;
}
