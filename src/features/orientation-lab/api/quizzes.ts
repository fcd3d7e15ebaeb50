import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { CreateQuizBody, QuizRow, UpdateQuizBody } from '../../../../shared/api/lab';
import { api } from '../../../lib/api-client';

export const quizzesQuery = () => queryOptions({ queryKey: ['lab', 'quizzes'], queryFn: ({ signal }) => api<{ items: QuizRow[] }>('/lab/quizzes', { signal }) });
export const quizQuery = (id: string) => queryOptions({ queryKey: ['lab', 'quizzes', id], queryFn: ({ signal }) => api<QuizRow>(`/lab/quizzes/${id}`, { signal }) });

export const useQuizzes = () => useQuery(quizzesQuery());

export function useCreateQuiz() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: CreateQuizBody) => api<QuizRow>('/lab/quizzes', { method: 'POST', body }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['lab'] }),
  });
}

export function useUpdateQuiz() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, ...body }: UpdateQuizBody & { id: string }) => api<QuizRow>(`/lab/quizzes/${id}`, { method: 'PATCH', body }),
    onSettled: () => qc.invalidateQueries({ queryKey: ['lab'] }),
  });
}
