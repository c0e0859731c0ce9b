import type { CloneClassMemberDTO } from '@shared/api/snapshots';

/**
 * Where a member is: its path, preceded by its repository for a class that spans repositories.
 *
 * @example
 * memberPlace({ path: 'billing/tariff.js', repositoryName: 'freight-platform', … }) // 'freight-platform: billing/tariff.js'
 */
export function memberPlace(member: Pick<CloneClassMemberDTO, 'path' | 'repositoryName'>): string {
  return member.repositoryName ? `${member.repositoryName}: ${member.path}` : member.path;
}
