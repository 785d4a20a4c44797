// Public names of runtime/check: the independent expectation, the judge, the check of a scene or a recording, and the report.
export { ExpectedVoice, dopplerModelOf, declaredSpeedOfSound, EXPECTED_RATIO_RANGE, GAME_CLOCK_FLOOR } from './expect/expected-voice';
export type { DopplerModel, ExpectedSample } from './expect/expected-voice';
export { EmissionSolver } from './expect/emission-time';
export type { Emission } from './expect/emission-time';
export { CheckCurve } from './expect/check-curve';
export { TimeScaleTrack } from './expect/time-scale-track';
export { CheckPath } from './expect/check-path';
export { judgeSource, checkLimitDefaults } from './judge/judge-source';
export type { CheckLimits, JudgedSource, SourceFigures, UnjudgedReason, UnjudgedSpan } from './judge/judge-source';
export { checkScene, checkAudio, partialsOf } from './check-scene';
export type { CheckableScene, CheckOptions, CheckResult, CheckedSource, SceneRenderer } from './check-scene';
export { renderReportSvg, renderReportHtml, reportSvgDefaults, escapeXml, niceTicks, pathData } from './report-svg';
export type { CheckReport, ReportSvgOptions } from './report-svg';
export { writeReport } from './write-report';
export { svgToPng } from './report-png';
