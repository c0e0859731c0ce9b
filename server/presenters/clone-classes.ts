import type { CrossClassDetailDTO, OrganisationClassDTO } from '../../shared/api/clone-classes';
import type { FragmentPair } from '../clone-index/snapshot-pairs';
import type { CrossClassRow, CrossMemberRow } from '../queries/cross-classes';
import type { OrganisationClassRow } from '../queries/organisation-classes';
import { presentWaiver } from './snapshot';

/** A row of the organisation's class list. */
export function presentOrganisationClass(row: OrganisationClassRow): OrganisationClassDTO {
  return {
    scope: row.scope,
    id: row.id,
    size: row.size,
    tokens: row.tokens,
    minSimilarity: row.minSimilarity,
    maxSimilarity: row.maxSimilarity,
    cloneType: row.cloneType,
    language: row.language,
    status: row.status,
    repositories: row.repositories ?? [],
    snapshot: row.snapshotId === null ? null : { id: row.snapshotId, label: row.snapshotLabel ?? '' },
    paths: [...(row.paths ?? [])].sort().slice(0, 5),
    waiver: row.waiver && presentWaiver(row.waiver),
    acrossClassId: row.acrossClassId,
  };
}

/** A class across repositories with its members' code and the pairs among them. */
export function presentCrossClassDetail(row: CrossClassRow, members: CrossMemberRow[], pairs: FragmentPair[]): CrossClassDetailDTO {
  const repositories = new Map(members.map((m) => [m.repositoryId, m.repositoryName]));
  return {
    ...row,
    repositories: [...repositories].map(([id, name]) => ({ id, name })),
    members: members.map((m) => ({
      fragmentId: m.fragmentId,
      path: m.path,
      name: m.name,
      kind: m.kind,
      startLine: m.startLine,
      endLine: m.endLine,
      tokens: m.tokens,
      changed: false,
      code: m.code,
      repositoryId: m.repositoryId,
      repositoryName: m.repositoryName,
      snapshotId: m.snapshotId,
      snapshotLabel: m.snapshotLabel,
      classId: m.classId,
    })),
    pairs: pairs.map((p) => ({ a: p.a, b: p.b, similarity: p.similarity, type: p.type })),
  };
}
