// Writes a check report to disk as SVG or HTML, chosen by the file extension.
import { writeFileSync } from 'node:fs';
import { extname } from 'node:path';
import { renderReportHtml, renderReportSvg, type CheckReport, type ReportSvgOptions } from './report-svg';

/** Writes `report` to `path`: '.svg' → standalone SVG, '.html'/'.htm' → self-contained page; throws on other extensions. */
export function writeReport(path: string, report: CheckReport, options: ReportSvgOptions = {}): void {
  const ext = extname(path).toLowerCase();
  if (ext === '.svg') writeFileSync(path, renderReportSvg(report, options), 'utf8');
  else if (ext === '.html' || ext === '.htm') writeFileSync(path, renderReportHtml(report, options), 'utf8');
  else throw new Error(`report file must end in .svg or .html, got "${path}"`);
}
