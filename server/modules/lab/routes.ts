import { IdParams } from '../../../shared/api/common';
import { AnswerBody, CreateGroupBody, CreateQuizBody, StartAttemptBody, UpdateGroupBody, UpdateQuizBody } from '../../../shared/api/lab';
import { CAN } from '../../../shared/domain/roles';
import { route, type RouteDef } from '../../http/routes';
import type { Deps } from '../../deps';
import { labService } from './service';

// Trainers build quizzes and groups and read results; anyone signed in takes a quiz. Nothing here
// writes an inspection-side table.
export function labRoutes(deps: Deps): RouteDef[] {
  const svc = labService(deps.db, deps.drawings);
  return [
    route({
      method: 'get',
      path: '/lab/people',
      access: CAN.train,
      summary: 'Active people a trainer can put in a group',
      handler: async () => ({ body: { items: await svc.people() } }),
    }),
    route({
      method: 'get',
      path: '/lab/groups',
      access: CAN.train,
      summary: 'Training groups with their members',
      handler: async () => ({ body: { items: await svc.groups() } }),
    }),
    route({
      method: 'post',
      path: '/lab/groups',
      access: CAN.train,
      summary: 'Create a training group',
      body: CreateGroupBody,
      handler: async ({ person, ip, body }) => ({ status: 201, body: await svc.createGroup(person, ip, body) }),
    }),
    route({
      method: 'patch',
      path: '/lab/groups/:id',
      access: CAN.train,
      summary: 'Rename a training group or replace its members',
      params: IdParams,
      body: UpdateGroupBody,
      handler: async ({ person, ip, params, body }) => ({ body: await svc.updateGroup(person, ip, params.id, body) }),
    }),
    route({
      method: 'get',
      path: '/lab/quizzes',
      access: CAN.train,
      summary: 'Every quiz, drafts and shared',
      handler: async () => ({ body: { items: await svc.quizzes() } }),
    }),
    route({
      method: 'post',
      path: '/lab/quizzes',
      access: CAN.train,
      summary: 'Build a quiz from prompt templates (optionally shared with a group)',
      body: CreateQuizBody,
      handler: async ({ person, ip, body }) => ({ status: 201, body: await svc.createQuiz(person, ip, body) }),
    }),
    route({
      method: 'get',
      path: '/lab/quizzes/:id',
      access: CAN.train,
      summary: 'One quiz',
      params: IdParams,
      handler: async ({ params }) => ({ body: await svc.quiz(params.id) }),
    }),
    route({
      method: 'patch',
      path: '/lab/quizzes/:id',
      access: CAN.train,
      summary: 'Change a quiz or share it with a group (versioned)',
      params: IdParams,
      body: UpdateQuizBody,
      handler: async ({ person, ip, params, body }) => ({ body: await svc.updateQuiz(person, ip, params.id, body) }),
    }),
    route({
      method: 'get',
      path: '/lab/quizzes/:id/results',
      access: CAN.train,
      summary: 'Scores and time per prompt per person, and the most-missed prompts',
      params: IdParams,
      handler: async ({ params }) => ({ body: await svc.results(params.id) }),
    }),
    route({
      method: 'get',
      path: '/lab/my-quizzes',
      access: CAN.takeQuiz,
      summary: "Quizzes shared with the signed-in person's groups, with their best score",
      handler: async ({ person }) => ({ body: { items: await svc.myQuizzes(person) } }),
    }),
    route({
      method: 'post',
      path: '/lab/quizzes/:id/attempts',
      access: CAN.takeQuiz,
      summary: 'Start a quiz: prompts are generated with the F placed at random (or from a given seed)',
      params: IdParams,
      body: StartAttemptBody,
      handler: async ({ person, ip, params, body }) => ({ status: 201, body: await svc.start(person, ip, params.id, body) }),
    }),
    route({
      method: 'get',
      path: '/lab/attempts/:id',
      access: CAN.takeQuiz,
      summary: 'An attempt with its prompts and the answers so far (own, or any for a trainer)',
      params: IdParams,
      handler: async ({ person, params }) => ({ body: await svc.attempt(person, params.id) }),
    }),
    route({
      method: 'post',
      path: '/lab/attempts/:id/answers',
      access: CAN.takeQuiz,
      summary: 'Answer one prompt; graded through the orientation engine, with the reason',
      params: IdParams,
      body: AnswerBody,
      handler: async ({ person, ip, params, body }) => ({ status: 201, body: await svc.answer(person, ip, params.id, body) }),
    }),
    route({
      method: 'post',
      path: '/lab/attempts/:id/finish',
      access: CAN.takeQuiz,
      summary: 'Stop an attempt early; unanswered prompts count as not right',
      params: IdParams,
      handler: async ({ person, ip, params }) => ({ body: await svc.finish(person, ip, params.id) }),
    }),
  ];
}
