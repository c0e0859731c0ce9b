import type { Express } from 'express';
import request from 'supertest';
import { CSRF_HEADER } from '../../shared/api/session';
import type { User } from '../../server/models/User';
import { TEST_PASSWORD } from './factories';

/** A supertest agent that keeps its cookie and sends the session's CSRF token on every request. */
export type Agent = ReturnType<typeof request.agent>;

/**
 * An anonymous agent that has fetched GET /api/session: it holds a session cookie and sends that
 * session's CSRF token, as the client does before signing in.
 */
export async function anonymousAgent(app: Express): Promise<Agent> {
  const agent = request.agent(app);
  const res = await agent.get('/api/session').expect(200);
  agent.set(CSRF_HEADER, res.body.csrfToken);
  return agent;
}

/**
 * An agent signed in as the user (with TEST_PASSWORD unless told otherwise), sending the CSRF
 * token of its new session. Throws with the answer when sign-in fails.
 *
 * @example
 * const agent = await signedInAgent(app, await buildUser({ role: 'lead' }));
 * await agent.get('/api/users').expect(403);
 */
export async function signedInAgent(app: Express, user: User, password = TEST_PASSWORD): Promise<Agent> {
  const agent = await anonymousAgent(app);
  const res = await agent.post('/api/session').send({ email: user.email, password });
  if (res.status !== 200) throw new Error(`sign-in as ${user.email} failed: ${res.status} ${JSON.stringify(res.body)}`);
  agent.set(CSRF_HEADER, res.body.csrfToken);
  return agent;
}
