/**
 * The parts of a SARIF 2.1.0 log (the OASIS Static Analysis Results Interchange Format) that
 * Doublet writes, shared by the scan report (sarif.ts) and `doublet push --format sarif`
 * (snapshot-sarif.ts). Property names and nesting follow the standard; fields Doublet never
 * fills are left out.
 */

/** SARIF 2.1.0 identifiers (from the OASIS standard). */
export const SARIF_VERSION = '2.1.0';
export const SARIF_SCHEMA = 'https://docs.oasis-open.org/sarif/sarif/v2.1.0/errata01/os/schemas/sarif-schema-2.1.0.json';

/** `message`: plain text only (never source text in Doublet's logs). */
export interface SarifMessage {
  text: string;
}

/** A file region; lines are 1-based and inclusive. */
export interface SarifPhysicalLocation {
  artifactLocation: { uri: string; uriBaseId?: string };
  region?: { startLine: number; endLine?: number };
}

export interface SarifLocation {
  id?: number;
  physicalLocation: SarifPhysicalLocation;
  message?: SarifMessage;
}

export interface SarifRule {
  id: string;
  name?: string;
  shortDescription?: SarifMessage;
  fullDescription?: SarifMessage;
  help?: SarifMessage;
  defaultConfiguration?: { level: SarifLevel };
}

export type SarifLevel = 'none' | 'note' | 'warning' | 'error';

export interface SarifResult {
  ruleId: string;
  ruleIndex?: number;
  level?: SarifLevel;
  message: SarifMessage;
  locations?: SarifLocation[];
  relatedLocations?: SarifLocation[];
  /** stable identities across runs, so code-scanning hosts can track a result from release to release */
  partialFingerprints?: Record<string, string>;
  /** `external`: the result was judged acceptable outside the log (a Doublet waiver) */
  suppressions?: { kind: 'inSource' | 'external'; justification?: string }[];
  properties?: Record<string, unknown>;
}

export interface SarifRun {
  tool: { driver: { name: string; version?: string; informationUri?: string; rules?: SarifRule[] } };
  originalUriBaseIds?: Record<string, { uri?: string; description?: SarifMessage }>;
  automationDetails?: { id?: string; description?: SarifMessage };
  columnKind?: 'utf16CodeUnits' | 'unicodeCodePoints';
  results: SarifResult[];
  properties?: Record<string, unknown>;
}

export interface SarifLog {
  $schema?: string;
  version: typeof SARIF_VERSION;
  runs: SarifRun[];
}

/** A relative path as a SARIF URI reference: each segment percent-encoded, the slashes kept. */
export function relativeUri(path: string): string {
  return path.split('/').map(encodeURIComponent).join('/');
}
