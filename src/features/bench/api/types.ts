// Shapes of the Bench API answers (server/services/diagnosis.service.ts and bench.service.ts).
export interface BenchProcedure {
  procedureId: string; slug: string; title: string; symptom: string; ignitionSystem: string; versionId: string; number: number;
}
export interface BenchVersion { id: string; slug: string; title: string; number: number; document: unknown; branchCounts?: Record<string, Record<string, number>> }
export interface Vehicle { id: string; label: string; model: string; frameNumber: string; hours: number | null; lastDiagnosedAt?: string | null }
export interface Meter { id: string; name: string; spec: { entries?: { quantity: string; percentOfReading: number; counts: number; resolution: number }[] } }
export interface DiagnosisSummary {
  id: string; status: string; procedureTitle: string; vehicleLabel: string; vehicleModel: string; complaint: string;
  startedAt: string; endedAt: string | null; lastActivityAt: string; stepsAnswered: number;
  technicianName: string; currentStepTitle: string | null;
}
export interface RecordStep {
  id: string; seq: number; stepId: string; kind: string; entered: string | null; startedAtShown?: string; value: number | null; unit: string | null;
  verdict: string | null; answerId: string | null; superseded: boolean; note: string; startedAt: string; answeredAt: string;
  shown: { title?: string; limitsText?: string; cause?: string; repair?: string; answers?: { id: string; label: string }[]; leadEntered?: string; acknowledged?: boolean; acknowledgedAt?: string;
    quantity?: string; unit?: string; corrections?: { leadNull?: number; temperatureFactor?: number } };
}
export interface DiagnosisRecord extends DiagnosisSummary {
  versionNumber: number; endingStepId: string | null; meterName: string | null;
  vehicleFrameNumber: string; conditions: Record<string, unknown>;
  outcome: { partsFitted?: { name: string; lot: string }[]; finalCheck?: { spark: boolean; runs: boolean; stops: boolean }; labourMinutes?: number; reason?: string } | null;
  steps: RecordStep[];
  attachments: { id: string; stepId: string | null; originalName: string; hasThumb: boolean }[];
  coachingNotes: { id: string; stepId: string | null; body: string; authorName: string | null; createdAt: string }[];
}
export type RecordWithMeter = DiagnosisRecord & { versionId: string; meterEntries: { quantity: string; percentOfReading: number; counts: number; resolution: number }[] };
