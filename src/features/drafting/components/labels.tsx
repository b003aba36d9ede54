import { Badge } from '../../../components/ui/card';
import { STEP_KINDS, type StepKind } from '@shared/schema';
import { kindLabel } from '@shared/engine/kinds';
import type { VersionStatus } from '../api/types';

export const IGNITION_LABELS: Record<string, string> = {
  'magneto-cdi': 'Magneto CDI', 'battery-cdi': 'Battery CDI', 'magneto-inductive': 'Magneto inductive',
  'battery-inductive': 'Battery inductive', other: 'Other',
};

/** The name of each step kind, from the kinds' one table in shared/. */
export const KIND_LABELS = Object.fromEntries(STEP_KINDS.map((k) => [k, kindLabel(k)])) as Record<StepKind, string>;

const STATUS: Record<VersionStatus, { label: string; tone: 'neutral' | 'go' | 'signal' | 'edge' }> = {
  draft: { label: 'Draft', tone: 'signal' },
  in_review: { label: 'In review', tone: 'edge' },
  published: { label: 'Published', tone: 'go' },
  retired: { label: 'Retired', tone: 'neutral' },
};

export function StatusBadge({ status }: { status: VersionStatus }) {
  return <Badge tone={STATUS[status].tone}>{STATUS[status].label}</Badge>;
}
