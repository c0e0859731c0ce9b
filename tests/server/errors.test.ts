import { describe, expect, it } from 'vitest';
import { ConflictError, found, fromDatabaseError, NotFoundError } from '../../server/errors';

describe('fromDatabaseError', () => {
  it('turns a unique violation, wrapped by Sequelize or bare from the driver, into a 409 naming the field', () => {
    const wrapped = fromDatabaseError({ name: 'SequelizeUniqueConstraintError', parent: { code: '23505', constraint: 'repositories_organisation_id_name_key' } });
    expect(wrapped).toBeInstanceOf(ConflictError);
    expect(wrapped).toMatchObject({ status: 409, code: 'conflict', field: 'name' });
    expect(fromDatabaseError({ code: '23505', constraint: 'snapshots_repository_id_label_key' })).toMatchObject({ status: 409, field: 'label' });
  });

  describe('edge cases', () => {
    it('gives an unknown constraint a 409 without a field, and passes every other error through', () => {
      const unknown = fromDatabaseError({ code: '23505', constraint: 'somewhere_else_key', detail: 'Key (name)=(secret) already exists.' });
      expect(unknown).toMatchObject({ status: 409, field: undefined });
      expect((unknown as Error).message).not.toContain('secret');
      const other = new Error('connection reset');
      expect(fromDatabaseError(other)).toBe(other);
      expect(fromDatabaseError({ code: '23503' })).toEqual({ code: '23503' });
      expect(fromDatabaseError(null)).toBeNull();
    });
  });
});

describe('found', () => {
  it('returns the record, or throws a 404 naming what is missing', () => {
    expect(found(0, 'Count')).toBe(0);
    expect(() => found(null, 'Repository')).toThrow(NotFoundError);
    expect(() => found(undefined, 'Snapshot')).toThrow('Snapshot not found.');
  });
});
