import { describe, expect, it } from 'vitest';
import { FIRST_ADMIN_COMMAND, firstAdminLines, firstRunStep } from '../../../server/commands/firstRun';
import { loadConfig } from '../../../server/config';

describe('firstRunStep', () => {
  it('seeds the demo on a database with no users unless DOUBLET_DEMO=0', () => {
    expect(firstRunStep(0, 'auto')).toBe('seed');
    expect(firstRunStep(0, 'off')).toBe('first-admin');
  });

  it('leaves a database with users alone unless DOUBLET_DEMO=1 forces the seed attempt', () => {
    expect(firstRunStep(1, 'auto')).toBe('nothing');
    expect(firstRunStep(57, 'off')).toBe('nothing');
    expect(firstRunStep(57, 'on')).toBe('force-seed');
    expect(firstRunStep(0, 'on')).toBe('force-seed');
  });

  it('prints the exact user:create command for the first admin', () => {
    expect(firstAdminLines()).toContain(`  ${FIRST_ADMIN_COMMAND}`);
    expect(FIRST_ADMIN_COMMAND).toMatch(/^npm run user:create -- --email \S+ --name "[^"]+" --role admin --organisation "[^"]+"$/);
  });

  describe('edge cases', () => {
    it('reads DOUBLET_DEMO as 1, 0 or unset, and refuses anything else', () => {
      const saved = process.env.DOUBLET_DEMO;
      try {
        delete process.env.DOUBLET_DEMO;
        expect(loadConfig().demo).toBe('auto');
        process.env.DOUBLET_DEMO = '1';
        expect(loadConfig().demo).toBe('on');
        process.env.DOUBLET_DEMO = '0';
        expect(loadConfig().demo).toBe('off');
        process.env.DOUBLET_DEMO = 'yes';
        expect(() => loadConfig()).toThrow('DOUBLET_DEMO must be 1 (seed the demo) or 0 (no demo), got "yes"');
      } finally {
        if (saved === undefined) delete process.env.DOUBLET_DEMO;
        else process.env.DOUBLET_DEMO = saved;
      }
    });
  });
});
