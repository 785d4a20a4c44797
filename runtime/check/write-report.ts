// Writes a check report to disk as SVG, HTML or PNG, chosen by the file extension.
import { writeFileSync } from 'node:fs';
import { extname } from 'node:path';
import { renderReportHtml, renderReportSvg, type CheckReport, type ReportSvgOptions } from './report-svg';
import { svgToPng } from './report-png';

/** Writes `report` to `path`: '.svg' standalone SVG, '.html'/'.htm' self-contained page, '.png' raster; throws on other extensions. */
export async function writeReport(path: string, report: CheckReport, options: ReportSvgOptions = {}): Promise<void> {
  const ext = extname(path).toLowerCase();
  if (ext === '.svg') writeFileSync(path, renderReportSvg(report, options), 'utf8');
  else if (ext === '.html' || ext === '.htm') writeFileSync(path, renderReportHtml(report, options), 'utf8');
  else if (ext === '.png') writeFileSync(path, await svgToPng(renderReportSvg(report, options)));
  else throw new Error(`report file must end in .svg, .html or .png, got "${path}"`);
}
