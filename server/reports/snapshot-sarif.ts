import type { CloneClassDetailDTO, SnapshotDTO } from '../../shared/api/snapshots';
import { relativeUri, SARIF_SCHEMA, SARIF_VERSION, type SarifLog, type SarifResult, type SarifRule } from './sarif-log';

/** Where the members' paths are rooted: the folder that was pushed (the archive's root). */
export const SOURCE_ROOT = '%SRCROOT%';

/** The rules of `doublet push --format sarif`: one per class status worth a reviewer's look. */
export const SNAPSHOT_RULES = [
  {
    id: 'new-clone-class',
    name: 'NewCloneClass',
    shortDescription: { text: 'A new group of near copies appeared in this release' },
    fullDescription: {
      text: 'These functions are near copies of each other (their token shingle sets reach the Jaccard threshold) and were not a clone class in the previous release. A fix made in one copy is likely needed in the others: consider one shared function.',
    },
    defaultConfiguration: { level: 'warning' },
  },
  {
    id: 'drifted-clone-class',
    name: 'DriftedCloneClass',
    shortDescription: { text: 'Near copies changed unevenly since the previous release' },
    fullDescription: {
      text: 'This clone class existed in the previous release, and some of its members changed while others did not. A change made to one copy may be missing from the rest.',
    },
    defaultConfiguration: { level: 'warning' },
  },
] as const satisfies readonly SarifRule[];

/** The class statuses the log reports, each with its rule. */
export const SARIF_STATUSES = { new: 'new-clone-class', drifted: 'drifted-clone-class' } as const;

/** What the log is built from: the ready snapshot, its new and drifted classes with members, the verdict. */
export interface SnapshotSarifInput {
  repository: { id: number; name: string };
  snapshot: SnapshotDTO;
  /** the new and drifted classes, members included (their code is never read) */
  classes: CloneClassDetailDTO[];
  budget: string | null;
  verdict: 'within' | 'over' | 'none';
  /** the snapshot's page */
  url: string;
  /** set when there were more classes than the log holds */
  omittedClassCount: number;
  toolVersion?: string;
}

const similarityText = (c: CloneClassDetailDTO) =>
  c.minSimilarity === c.maxSimilarity ? c.minSimilarity.toFixed(2) : `${c.minSimilarity.toFixed(2)}–${c.maxSimilarity.toFixed(2)}`;

/** One result per class: located at every member, message naming members, similarity and tokens (no code). */
function classResult(c: CloneClassDetailDTO): SarifResult {
  const ruleId = c.status === 'drifted' ? SARIF_STATUSES.drifted : SARIF_STATUSES.new;
  const members = c.members.map((m) => `${m.name} (${m.path}:${m.startLine}-${m.endLine}${c.status === 'drifted' && m.changed ? ', changed' : ''})`);
  const what = c.status === 'drifted' ? 'Drifted clone class' : 'New clone class';
  return {
    ruleId,
    ruleIndex: SNAPSHOT_RULES.findIndex((r) => r.id === ruleId),
    level: 'warning',
    message: { text: `${what} of ${c.members.length} near copies, similarity ${similarityText(c)}, ${c.tokens} tokens: ${members.join(', ')}.` },
    locations: c.members.map((m, index) => ({
      id: index,
      physicalLocation: { artifactLocation: { uri: relativeUri(m.path), uriBaseId: SOURCE_ROOT }, region: { startLine: m.startLine, endLine: m.endLine } },
      message: { text: m.name },
    })),
    // The lineage is the same group of copies from release to release: hosts that track results keep one alert.
    partialFingerprints: { 'doubletCloneLineage/v1': String(c.lineageId) },
    ...(c.waiver ? { suppressions: [{ kind: 'external' as const, justification: c.waiver.reason }] } : {}),
    properties: {
      cloneClassId: c.id,
      status: c.status,
      size: c.members.length,
      tokens: c.tokens,
      minSimilarity: c.minSimilarity,
      maxSimilarity: c.maxSimilarity,
      cloneType: c.cloneType,
      language: c.language,
    },
  };
}

/** The snapshot's new and drifted clone classes as a SARIF 2.1.0 log, with the budget verdict in run.properties. */
export function snapshotSarif(input: SnapshotSarifInput): SarifLog {
  const { snapshot, repository } = input;
  const m = snapshot.metrics;
  return {
    $schema: SARIF_SCHEMA,
    version: SARIF_VERSION,
    runs: [
      {
        tool: { driver: { name: 'Doublet', ...(input.toolVersion ? { version: input.toolVersion } : {}), rules: [...SNAPSHOT_RULES] } },
        originalUriBaseIds: { [SOURCE_ROOT]: { description: { text: 'The folder given to doublet push.' } } },
        automationDetails: { id: `doublet/${repository.name}/${snapshot.label}` },
        results: input.classes.map(classResult),
        properties: {
          repository: repository.name,
          snapshot: { id: snapshot.id, label: snapshot.label, url: input.url },
          cloneRatio: m?.cloneRatio ?? snapshot.cloneRatio ?? null,
          unwaivedCloneRatio: m?.unwaivedCloneRatio ?? null,
          classCount: m?.classCount ?? null,
          newClassCount: m?.newClassCount ?? null,
          driftedClassCount: m?.driftedClassCount ?? null,
          budget: input.budget,
          verdict: input.verdict,
          omittedClassCount: input.omittedClassCount,
        },
      },
    ],
  };
}
