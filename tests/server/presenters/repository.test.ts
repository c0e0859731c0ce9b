import { describe, expect, it } from 'vitest';
import { Repository } from '../../../server/models/Repository';
import { presentRepository } from '../../../server/presenters/repository';
import type { LatestSnapshot } from '../../../server/queries/repositories';
import { useDatabase } from '../../support';

useDatabase(); // binds the models, so Repository.build works

const repository = (cloneBudget: string | null) =>
  Repository.build({ id: 1, organisationId: '00000000-0000-4000-8000-000000000000', name: 'wagon-yard', cloneBudget, createdAt: new Date(0) });
const latest = (clonedTokens: number, fragmentTokens: number, unwaivedClonedTokens = clonedTokens): LatestSnapshot => ({
  id: 7,
  label: '2026.11',
  cloneRatio: clonedTokens / fragmentTokens,
  clonedTokens,
  unwaivedClonedTokens,
  fragmentTokens,
  createdAt: new Date(0),
});

describe('presentRepository', () => {
  it('gives the budget verdict from token counts, exactly: at the budget is not over it', () => {
    expect(presentRepository(repository('0.100000'), latest(100, 1000)).overBudget).toBe(false);
    expect(presentRepository(repository('0.100000'), latest(101, 1000)).overBudget).toBe(true);
    // the stored ratio rounds to 0.1 here, the token counts do not
    expect(presentRepository(repository('0.100000'), latest(900000000000000, 8999999999999999)).overBudget).toBe(true);
  });

  it('leaves waived classes out of the verdict: the unwaived cloned tokens decide', () => {
    const waived = presentRepository(repository('0.100000'), latest(300, 1000, 100));
    expect(waived.overBudget).toBe(false);
    expect(waived.latestSnapshot!.cloneRatio).toBe(0.3);
    expect(waived.latestSnapshot!.unwaivedCloneRatio).toBe(0.1);
    expect(presentRepository(repository('0.100000'), latest(300, 1000, 101)).overBudget).toBe(true);
  });

  describe('edge cases', () => {
    it('is never over budget without a budget, a snapshot or figures', () => {
      expect(presentRepository(repository(null), latest(1000, 1000)).overBudget).toBe(false);
      expect(presentRepository(repository('0'), null).overBudget).toBe(false);
      expect(presentRepository(repository('0'), { ...latest(5, 10), clonedTokens: null, unwaivedClonedTokens: null, fragmentTokens: null }).overBudget).toBe(false);
    });

    it('reads a budget set in this request in the form the column stores', () => {
      expect(presentRepository(repository('0.1234567'), latest(123457, 1000000)).overBudget).toBe(false);
      expect(presentRepository(repository('1e-7'), latest(1, 1000)).overBudget).toBe(true);
    });
  });
});
