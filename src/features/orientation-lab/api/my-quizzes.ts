import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MyQuizRow } from '../../../../shared/api/lab';
import { api } from '../../../lib/api-client';

export const myQuizzesQuery = () => queryOptions({ queryKey: ['lab', 'my-quizzes'], queryFn: ({ signal }) => api<{ items: MyQuizRow[] }>('/lab/my-quizzes', { signal }) });
export const useMyQuizzes = () => useQuery(myQuizzesQuery());
