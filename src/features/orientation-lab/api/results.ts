import { queryOptions, useQuery } from '@tanstack/react-query';
import type { QuizResults } from '../../../../shared/api/lab';
import { api } from '../../../lib/api-client';

export const quizResultsQuery = (quizId: string) =>
  queryOptions({ queryKey: ['lab', 'quizzes', quizId, 'results'], queryFn: ({ signal }) => api<QuizResults>(`/lab/quizzes/${quizId}/results`, { signal }) });
export const useQuizResults = (quizId: string) => useQuery(quizResultsQuery(quizId));
