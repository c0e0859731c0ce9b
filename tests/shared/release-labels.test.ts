import { describe, expect, it } from 'vitest';
import { releaseReached } from '../../shared/release-labels';

describe('releaseReached', () => {
  it('is reached by the same label, whatever its case and surrounding spaces', () => {
    expect(releaseReached('2026.10', '2026.10')).toBe(true);
    expect(releaseReached('Spring-Timetable', ' spring-timetable ')).toBe(true);
  });

  it('is reached by a later version of the same form, number by number (not as text)', () => {
    expect(releaseReached('2026.10', '2026.11')).toBe(true);
    expect(releaseReached('2026.9', '2026.10')).toBe(true);
    expect(releaseReached('v2', 'v10')).toBe(true);
    expect(releaseReached('1.9.0', '1.10.0')).toBe(true);
    expect(releaseReached('1.10', '1.10.0.1')).toBe(true);
    expect(releaseReached('release-4', 'release-5')).toBe(true);
  });

  it('is not reached by an earlier version', () => {
    expect(releaseReached('2026.11', '2026.10')).toBe(false);
    expect(releaseReached('v10', 'v9')).toBe(false);
    expect(releaseReached('1.10.0', '1.9.7')).toBe(false);
  });

  it('is not reached across forms, or by another label without numbers', () => {
    expect(releaseReached('v3', '2026.11')).toBe(false);
    expect(releaseReached('release-4', 'hotfix-9')).toBe(false);
    expect(releaseReached('spring-timetable', 'summer-timetable')).toBe(false);
    expect(releaseReached('2026.10', 'main')).toBe(false);
  });

  it('treats missing trailing numbers as zeros (1.10 and 1.10.0 are one release)', () => {
    expect(releaseReached('1.10.0', '1.10')).toBe(true);
  });
});
