
// Answers of the Debrief endpoints that are shaped on the server (see server/services/debrief-*.ts).

export type { DebriefProcedure, ReplayStep, Replay, CoachingNoteDto as CoachingNote } from '@shared/stats/debrief-answers';
