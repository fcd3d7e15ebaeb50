import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { AnswerBody, AnswerResult, AttemptView, StartAttemptBody } from '../../../../shared/api/lab';
import { api } from '../../../lib/api-client';

export const attemptQuery = (id: string) =>
  queryOptions({ queryKey: ['lab', 'attempts', id], queryFn: ({ signal }) => api<AttemptView>(`/lab/attempts/${id}`, { signal }), staleTime: Infinity });

export const useAttempt = (id: string) => useQuery(attemptQuery(id));

export function useStartAttempt() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ quizId, ...body }: StartAttemptBody & { quizId: string }) => api<AttemptView>(`/lab/quizzes/${quizId}/attempts`, { method: 'POST', body }),
    onSuccess: (a) => {
      qc.setQueryData(attemptQuery(a.id).queryKey, a);
      void qc.invalidateQueries({ queryKey: ['lab', 'my-quizzes'] });
    },
  });
}

/** Records the answer in the cached attempt, so a reload or going back shows it as answered. */
export function useAnswer(attemptId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: AnswerBody) => api<AnswerResult>(`/lab/attempts/${attemptId}/answers`, { method: 'POST', body }),
    onSuccess: (r) => {
      qc.setQueryData(attemptQuery(attemptId).queryKey, (a) =>
        a
          ? {
              ...a,
              answers: [...a.answers.filter((x) => x.promptIndex !== r.promptIndex), { promptIndex: r.promptIndex, correct: r.correct, ms: r.ms, given: r.given, expected: r.expected, reason: r.reason }],
              finishedAt: r.finished ? new Date().toISOString() : a.finishedAt,
              score: r.finished ? r.score : a.score,
            }
          : a,
      );
      if (r.finished) void qc.invalidateQueries({ queryKey: ['lab', 'my-quizzes'] });
    },
  });
}

export function useFinishAttempt(attemptId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => api<AttemptView>(`/lab/attempts/${attemptId}/finish`, { method: 'POST' }),
    onSuccess: (a) => {
      qc.setQueryData(attemptQuery(attemptId).queryKey, a);
      void qc.invalidateQueries({ queryKey: ['lab', 'my-quizzes'] });
    },
  });
}
