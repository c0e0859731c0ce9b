import { describe, expect, it } from 'vitest';
import { isDatabaseUnavailable } from '../../../server/db/unavailable';

const withCode = (message: string, code: string) => Object.assign(new Error(message), { code });

describe('isDatabaseUnavailable', () => {
  it('recognises a refused connection, as node-postgres reports it', () => {
    expect(isDatabaseUnavailable(withCode('connect ECONNREFUSED 127.0.0.1:5432', 'ECONNREFUSED'))).toBe(true);
  });

  it('recognises a backend ended by a fast shutdown (SQLSTATE 57P01) inside a Sequelize wrapper', () => {
    const pgError = withCode('terminating connection due to administrator command', '57P01');
    const wrapped = Object.assign(new Error(pgError.message), { name: 'SequelizeDatabaseError', parent: pgError, original: pgError });
    expect(isDatabaseUnavailable(wrapped)).toBe(true);
  });

  it('recognises the connection-exception class 08 and a server that is starting or stopping', () => {
    expect(isDatabaseUnavailable(withCode('connection failure', '08006'))).toBe(true);
    expect(isDatabaseUnavailable(withCode('the database system is starting up', '57P03'))).toBe(true);
    expect(isDatabaseUnavailable(new Error('Connection terminated unexpectedly'))).toBe(true);
  });

  it('recognises Sequelize connection errors by name and follows a standard cause', () => {
    const refused = Object.assign(new Error('connect ECONNREFUSED'), { name: 'SequelizeConnectionRefusedError' });
    expect(isDatabaseUnavailable(refused)).toBe(true);
    expect(isDatabaseUnavailable(new Error('session store failed', { cause: refused }))).toBe(true);
  });

  it('leaves query errors, bugs and non-errors alone', () => {
    expect(isDatabaseUnavailable(withCode('relation "x" does not exist', '42P01'))).toBe(false);
    expect(isDatabaseUnavailable(withCode('duplicate key value violates unique constraint', '23505'))).toBe(false);
    expect(isDatabaseUnavailable(new TypeError('Cannot read properties of undefined'))).toBe(false);
    expect(isDatabaseUnavailable(undefined)).toBe(false);
    expect(isDatabaseUnavailable('ECONNREFUSED')).toBe(false);
  });

  describe('edge cases', () => {
    it('stops on a wrapper that points at itself', () => {
      const loop: Error & { parent?: unknown } = new Error('loop');
      loop.parent = loop;
      expect(isDatabaseUnavailable(loop)).toBe(false);
    });

    it('does not take an access-denied (a configuration error, not a passing outage) for unavailability', () => {
      const denied = Object.assign(new Error('password authentication failed'), { name: 'SequelizeAccessDeniedError', code: '28P01' });
      expect(isDatabaseUnavailable(denied)).toBe(false);
    });
  });
});
