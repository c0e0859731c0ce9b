import type { CloneReport } from '../../shared/api/clone-report';
import { writeCsv } from './csv';
import { toSarif, type SarifOptions } from './sarif';
import { writeText } from './text';

/** Output formats of every report writer. */
export const REPORT_FORMATS = ['text', 'json', 'csv', 'sarif'] as const;
/** One of REPORT_FORMATS. */
export type ReportFormat = (typeof REPORT_FORMATS)[number];

/** Options of writeReport (only SARIF has any). */
export type WriteReportOptions = SarifOptions;

/**
 * The report in one of the formats, as text ending with a newline.
 *
 * @example process.stdout.write(writeReport(report, 'sarif', { toolVersion: '0.1.0' }))
 */
export function writeReport(report: CloneReport, format: ReportFormat, options: WriteReportOptions = {}): string {
  switch (format) {
    case 'text':
      return writeText(report);
    case 'json':
      return `${JSON.stringify(report, null, 2)}\n`;
    case 'csv':
      return writeCsv(report);
    case 'sarif':
      return `${JSON.stringify(toSarif(report, options), null, 2)}\n`;
  }
}
