import { rateLimit } from 'express-rate-limit';
import { ChangePasswordBody, LoginBody } from '../../../shared/api/auth';
import { errorBody } from '../../http/errors';
import { route, type RouteDef } from '../../http/routes';
import type { Deps } from '../../deps';

export function authRoutes(deps: Deps): RouteDef[] {
  const auth = deps.services.auth;
  const loginLimiter = rateLimit({
    windowMs: deps.config.LOGIN_RATE_WINDOW_S * 1000,
    limit: deps.config.LOGIN_RATE_LIMIT,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (_req, res) => {
      res.status(429).json(errorBody('rate_limited', 'Too many sign-in attempts from here; wait a few minutes and try again'));
    },
  });
  return [
    route({
      method: 'post',
      path: '/auth/login',
      access: 'public',
      summary: 'Sign in with e-mail and password',
      before: [loginLimiter],
      body: LoginBody,
      handler: async ({ req, body }) => ({ body: await auth.login(req, body.email, body.password) }),
    }),
    route({
      method: 'post',
      path: '/auth/logout',
      access: 'public',
      summary: 'Sign out this session',
      handler: async ({ req }) => {
        await auth.logout(req, req.person ?? null);
      },
    }),
    route({
      method: 'post',
      path: '/auth/logout-everywhere',
      access: 'signed_in',
      summary: 'Sign out every session of the signed-in person',
      handler: async ({ req, person }) => {
        await auth.logoutEverywhere(req, person);
      },
    }),
    route({
      method: 'get',
      path: '/auth/me',
      access: 'signed_in',
      summary: 'The signed-in person',
      handler: ({ person }) => ({ body: person }),
    }),
    route({
      method: 'post',
      path: '/auth/password',
      access: 'signed_in',
      summary: 'Change your own password',
      body: ChangePasswordBody,
      handler: async ({ req, person, body }) => {
        await auth.changePassword(req, person, body.currentPassword, body.newPassword);
      },
    }),
  ];
}
