import { Badge } from '../../../components/ui/card';
import type { StepKind } from '@shared/schema';
import type { VersionStatus } from '../api/types';

export const IGNITION_LABELS: Record<string, string> = {
  'magneto-cdi': 'Magneto CDI', 'battery-cdi': 'Battery CDI', 'magneto-inductive': 'Magneto inductive',
  'battery-inductive': 'Battery inductive', other: 'Other',
};

export const KIND_LABELS: Record<StepKind, string> = {
  reading: 'Reading', observation: 'Observation', task: 'Task', formula: 'Formula', finding: 'Finding', handoff: 'Hand-off',
};

const STATUS: Record<VersionStatus, { label: string; tone: 'neutral' | 'go' | 'signal' | 'edge' }> = {
  draft: { label: 'Draft', tone: 'signal' },
  in_review: { label: 'In review', tone: 'edge' },
  published: { label: 'Published', tone: 'go' },
  retired: { label: 'Retired', tone: 'neutral' },
};

export function StatusBadge({ status }: { status: VersionStatus }) {
  return <Badge tone={STATUS[status].tone}>{STATUS[status].label}</Badge>;
}
