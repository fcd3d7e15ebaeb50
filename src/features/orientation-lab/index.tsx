import { Route, Routes, useParams } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { can } from '../../../shared/domain/roles';
import { meQuery } from './api/me';
import { FlipDemo } from './components/flip-demo';
import { GroupsPage } from './components/groups-page';
import { LabHome } from './components/lab-home';
import { Presenter } from './components/presenter';
import { QuizBuilder } from './components/quiz-builder';
import { QuizResultsPage } from './components/quiz-results';
import { QuizRunner } from './components/quiz-runner';
import { TakeQuiz } from './components/take-quiz';

/** Trainer-only pages; the server refuses the same calls to anyone else. */
function TrainerOnly({ children }: { children: React.ReactNode }) {
  const me = useQuery(meQuery());
  if (!me.data) return null;
  if (!can(me.data.role, 'train')) {
    return (
      <section role="alert" className="card max-w-xl p-6">
        <h1 className="text-2xl font-bold">For trainers</h1>
        <p>Building quizzes and reading results is a trainer's work.</p>
      </section>
    );
  }
  return <>{children}</>;
}

const Param = ({ render }: { render(id: string): React.ReactNode }) => <>{render(useParams().id ?? '')}</>;

/** Orientation lab: the flip demonstration, presenter mode, quizzes and their results. */
export default function OrientationLab() {
  return (
    <Routes>
      <Route index element={<LabHome />} />
      <Route path="flip" element={<FlipDemo />} />
      <Route path="present" element={<Presenter />} />
      <Route path="take/:id" element={<Param render={(id) => <TakeQuiz key={id} quizId={id} />} />} />
      <Route path="attempts/:id" element={<Param render={(id) => <QuizRunner key={id} attemptId={id} />} />} />
      <Route path="groups" element={<TrainerOnly><GroupsPage /></TrainerOnly>} />
      <Route path="quizzes/new" element={<TrainerOnly><QuizBuilder /></TrainerOnly>} />
      <Route path="quizzes/:id" element={<TrainerOnly><Param render={(id) => <QuizBuilder key={id} quizId={id} />} /></TrainerOnly>} />
      <Route path="quizzes/:id/results" element={<TrainerOnly><Param render={(id) => <QuizResultsPage quizId={id} />} /></TrainerOnly>} />
    </Routes>
  );
}
