// Public names of runtime/check: the expected heard frequency, the report as SVG/HTML, and writing it to disk.
export { ExpectedPitch, expectedHeardFrequencies, expectedPitchDefaults, straightLine, motionFromPositions, EXPECTED_MIN_RATIO } from './expected-pitch';
export type { ExpectedPitchInput, ExpectedTargets, MotionAt, MotionSample } from './expected-pitch';
export { renderReportSvg, renderReportHtml, reportSvgDefaults, escapeXml, niceTicks, pathData } from './report-svg';
export type { CheckReport, ReportSource, ReportSvgOptions } from './report-svg';
export { writeReport } from './write-report';
export { checkScene, scriptTimeScale, CHECK_EDGE_SECONDS, CHECK_WINDOW_SECONDS } from './check-scene';
export type { CheckableScene, CheckSceneOptions, CheckSceneResult } from './check-scene';
