import schema from '@microsoft/jest-sarif/lib/schemas/sarif-2.1.0-rtm.5.json' with { type: 'json' };
import Ajv from 'ajv-draft-04';
import addFormats from 'ajv-formats';
import { describe, expect, it } from 'vitest';
import { snapshotSarif } from '../../../server/reports/snapshot-sarif';
import type { CloneClassDetailDTO, CloneClassMemberDTO, SnapshotDTO } from '../../../shared/api/snapshots';

// The official SARIF 2.1.0 JSON schema (rtm.5, as shipped by the npm package @microsoft/jest-sarif),
// checked with ajv; it is draft-04, and one of its patterns is not valid in unicode mode.
const ajv = new Ajv({ allErrors: true, strict: false, unicodeRegExp: false });
addFormats(ajv);
const validate = ajv.compile(schema);

const SECRET_LINE = 'const fee = wagon.axles * contract.axleRate; // never in a log';

function member(path: string, name: string, startLine: number, changed = false): CloneClassMemberDTO {
  return { fragmentId: startLine, path, name, kind: 'function', startLine, endLine: startLine + 9, tokens: 80, changed, code: `function ${name}() {\n  ${SECRET_LINE}\n}` };
}

function cloneClass(id: number, status: 'new' | 'drifted', members: CloneClassMemberDTO[], waiver: CloneClassDetailDTO['waiver'] = null): CloneClassDetailDTO {
  return {
    id,
    snapshotId: 9,
    size: members.length,
    tokens: 160,
    minSimilarity: 0.82,
    maxSimilarity: 0.9,
    cloneType: 3,
    language: 'javascript',
    status,
    lineageId: id * 10,
    paths: members.map((m) => m.path),
    waiver,
    waiverEnded: null,
    repositoryId: 3,
    snapshotLabel: '2026.11',
    members,
    pairs: [{ a: 0, b: 1, similarity: 0.82, type: 3 }],
  };
}

const snapshot = { id: 9, label: '2026.11', cloneRatio: null, metrics: null } as unknown as SnapshotDTO;

describe('snapshotSarif', () => {
  const log = snapshotSarif({
    repository: { id: 3, name: 'freight-platform' },
    snapshot,
    classes: [
      cloneClass(1, 'new', [member('billing/axle fees.js', 'axleFee', 4), member('yard/fees.js', 'yardAxleFee', 20)]),
      cloneClass(2, 'drifted', [member('billing/tariff.js', 'priceConsignment', 2, true), member('yard/shunting.js', 'quoteYardMove', 2)], {
        reason: 'Merged in the 2027 tariff rework',
        untilLabel: null,
        createdByName: 'Ines Harrow',
        createdAt: '2026-11-02T09:00:00Z',
      }),
    ],
    budget: '5%',
    verdict: 'over',
    url: 'https://doublet.brackenfold.example/snapshots/9',
    omittedClassCount: 3,
  });

  it('validates against the SARIF 2.1.0 schema, holds no code, and carries the verdict and what was left out', () => {
    expect(validate(log), JSON.stringify(validate.errors)).toBe(true);
    expect(JSON.stringify(log)).not.toContain('axleRate');
    expect(log.runs[0].properties).toMatchObject({ budget: '5%', verdict: 'over', omittedClassCount: 3, cloneRatio: null });
  });

  it('gives each class one result under its rule, located at every member, with a waiver as an external suppression', () => {
    const [added, drifted] = log.runs[0].results;
    expect(added).toMatchObject({ ruleId: 'new-clone-class', ruleIndex: 0, level: 'warning', partialFingerprints: { 'doubletCloneLineage/v1': '10' } });
    expect(added.suppressions).toBeUndefined();
    expect(added.locations?.map((l) => l.physicalLocation)).toEqual([
      { artifactLocation: { uri: 'billing/axle%20fees.js', uriBaseId: '%SRCROOT%' }, region: { startLine: 4, endLine: 13 } },
      { artifactLocation: { uri: 'yard/fees.js', uriBaseId: '%SRCROOT%' }, region: { startLine: 20, endLine: 29 } },
    ]);
    expect(added.message.text).toBe('New clone class of 2 near copies, similarity 0.82–0.90, 160 tokens: axleFee (billing/axle fees.js:4-13), yardAxleFee (yard/fees.js:20-29).');
    expect(drifted).toMatchObject({ ruleId: 'drifted-clone-class', ruleIndex: 1, suppressions: [{ kind: 'external', justification: 'Merged in the 2027 tariff rework' }] });
    expect(drifted.message.text).toContain('priceConsignment (billing/tariff.js:2-11, changed), quoteYardMove (yard/shunting.js:2-11)');
  });
});
