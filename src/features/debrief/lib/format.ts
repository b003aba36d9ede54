import type { DiagnosisStatus } from '@shared/stats/debrief-schema';
import { formatReading } from '@shared/measure/format';
import type { Quantity } from '@shared/measure/quantities';

export const STATUS_LABEL: Record<DiagnosisStatus, string> = {
  active: 'Active', finished: 'Finished', handed_off: 'Handed off', abandoned: 'Abandoned',
};
export const STATUS_TONE: Record<DiagnosisStatus, 'neutral' | 'go' | 'edge' | 'stop' | 'signal'> = {
  active: 'neutral', finished: 'go', handed_off: 'signal', abandoned: 'stop',
};

/** 75 → "1 min 15 s"; 4000 → "1 h 07 min". */
export function formatDuration(seconds: number | null | undefined): string {
  if (seconds === null || seconds === undefined || !Number.isFinite(seconds)) return '–';
  const s = Math.round(seconds);
  if (s < 60) return `${s} s`;
  if (s < 3600) return `${Math.floor(s / 60)} min${s % 60 ? ` ${String(s % 60).padStart(2, '0')} s` : ''}`;
  return `${Math.floor(s / 3600)} h ${String(Math.floor((s % 3600) / 60)).padStart(2, '0')} min`;
}

export const minutes = (seconds: number | null | undefined) => (seconds === null || seconds === undefined ? '–' : (seconds / 60).toFixed(1));

export function percent(share: number | null | undefined, digits = 0): string {
  return share === null || share === undefined || !Number.isFinite(share) ? '–' : `${(share * 100).toFixed(digits)} %`;
}

export function formatValue(value: number | null | undefined, quantity: string | null, unit?: string | null): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '–';
  if (!quantity) return String(Number(value.toPrecision(3)));
  try {
    return formatReading({ value, quantity: quantity as Quantity }, unit ? { unit } : {});
  } catch {
    return String(Number(value.toPrecision(3)));
  }
}

export const dateTime = (iso: string | null) =>
  iso ? new Date(iso).toLocaleString(undefined, { year: 'numeric', month: 'short', day: 'numeric', hour: '2-digit', minute: '2-digit' }) : '–';
