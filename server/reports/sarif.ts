import type { CloneReport, ReportFragment } from '../../shared/api/clone-report';
import { fragmentIndex, similarityRange } from './format';
import { relativeUri, SARIF_SCHEMA, SARIF_VERSION } from './sarif-log';

export { SARIF_SCHEMA, SARIF_VERSION } from './sarif-log';

/** Options of toSarif. */
export interface SarifOptions {
  /** Version shown in SARIF's tool.driver. */
  toolVersion?: string;
}

/** The one rule every result belongs to. */
export const CLONE_RULE_ID = 'clone-class-member';

function physicalLocation(f: ReportFragment) {
  return {
    artifactLocation: { uri: relativeUri(f.file), uriBaseId: 'SRCROOT' },
    region: { startLine: f.startLine, endLine: f.endLine },
  };
}

/**
 * The report as a SARIF 2.1.0 log: one result per clone class member, located at the member,
 * with its clone pair partners as relatedLocations.
 */
export function toSarif(report: CloneReport, options: SarifOptions = {}) {
  const byId = fragmentIndex(report);
  const partners = new Map<number, { id: number; similarity: number; type: number }[]>();
  for (const pair of report.pairs) {
    for (const [self, other] of [[pair.a, pair.b], [pair.b, pair.a]]) {
      if (!partners.has(self)) partners.set(self, []);
      partners.get(self)!.push({ id: other, similarity: pair.similarity, type: pair.type });
    }
  }
  const results = report.classes.flatMap((c) =>
    c.members.map((id) => {
      const f = byId.get(id)!;
      const mine = partners.get(id) ?? [];
      return {
        ruleId: CLONE_RULE_ID,
        ruleIndex: 0,
        level: 'warning' as const,
        message: {
          text:
            `${f.name} is one of ${c.members.length} fragments in clone class ${c.id} ` +
            `(similarity ${similarityRange(c)}); it is similar to ${mine.length} of them at or above ${report.settings.threshold}.`,
        },
        locations: [{ physicalLocation: physicalLocation(f) }],
        relatedLocations: mine.map((partner, index) => {
          const other = byId.get(partner.id)!;
          return {
            id: index + 1,
            physicalLocation: physicalLocation(other),
            message: { text: `${other.name}: similarity ${partner.similarity.toFixed(2)}, clone type ${partner.type}` },
          };
        }),
        properties: { cloneClass: c.id, tokens: f.tokens },
      };
    }),
  );
  return {
    $schema: SARIF_SCHEMA,
    version: SARIF_VERSION,
    runs: [
      {
        tool: {
          driver: {
            name: 'doublet',
            ...(options.toolVersion ? { version: options.toolVersion } : {}),
            rules: [
              {
                id: CLONE_RULE_ID,
                name: 'CloneClassMember',
                shortDescription: { text: 'Function has near copies elsewhere' },
                fullDescription: {
                  text: 'This function belongs to a clone class: its token shingle set has a Jaccard similarity at or above the threshold with at least one other function. A fix made in one copy is likely needed in the others.',
                },
                defaultConfiguration: { level: 'warning' },
              },
            ],
          },
        },
        columnKind: 'unicodeCodePoints',
        results,
        properties: { cloneRatio: report.stats.cloneRatio, classCount: report.stats.classCount, pairCount: report.stats.pairCount },
      },
    ],
  };
}
