import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { AdvisorDraftBody, CoachingNoteBody } from '@shared/stats/debrief-schema';
import { debriefKeys } from './queries';
import type { CoachingNote } from './types';

export function useAddCoachingNote(diagnosisId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: CoachingNoteBody) => api.post<CoachingNote>(`/api/debrief/diagnoses/${diagnosisId}/coaching-notes`, body),
    onSuccess: () => qc.invalidateQueries({ queryKey: debriefKeys.diagnosis(diagnosisId) }),
  });
}

export function useDraftFromAdvice() {
  return useMutation({
    mutationFn: (body: AdvisorDraftBody) =>
      api.post<{ draftId: string; procedureId: string; basedOnNumber: number; warnings: number }>('/api/debrief/advisor/drafts', body),
  });
}
