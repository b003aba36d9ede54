import type { DiagnosisStatus } from '@shared/stats/debrief-schema';
import type { LocaleFormat } from '@shared/format/locale';
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

/** Debrief's figures in the shop's locale; `useDebriefFormat()` gives the one for the session. */
export interface DebriefFormat {
  count(n: number): string;
  fixed(n: number, digits: number): string;
  percent(share: number | null | undefined, digits?: number): string;
  /** Seconds as minutes with one decimal: 90 → "1.5" (or "1,5"). */
  minutes(seconds: number | null | undefined): string;
  /** A reading of a quantity in a display unit, "–" when there is none. */
  value(value: number | null | undefined, quantity: string | null, unit?: string | null): string;
  dateTime(iso: string | null): string;
}

export function debriefFormat(fmt: LocaleFormat): DebriefFormat {
  const plain = (v: number) => fmt.decimals(String(Number(v.toPrecision(3))));
  return {
    count: fmt.count,
    fixed: fmt.fixed,
    percent: fmt.percent,
    minutes: (seconds) => (seconds === null || seconds === undefined || !Number.isFinite(seconds) ? '–' : fmt.fixed(seconds / 60, 1)),
    value(value, quantity, unit) {
      if (value === null || value === undefined || !Number.isFinite(value)) return '–';
      if (!quantity) return plain(value);
      try {
        return fmt.reading({ value, quantity: quantity as Quantity }, unit ? { unit } : {});
      } catch {
        return plain(value);
      }
    },
    dateTime: (iso) => (iso ? fmt.dateTime(iso) : '–'),
  };
}
