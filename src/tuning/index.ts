// Public entry of src/tuning: the tuning document's defaults, parser, serializer and limits.
export { defaultTuning, TUNING_VERSION, DEFAULT_GROUP } from './default-tuning';
export { parseTuning } from './parse-tuning';
export { findDuplicateKeys, MAX_TUNING_TEXT } from './json-text';
export type { DuplicateKey } from './json-text';
export { serializeTuning } from './serialize-tuning';
export { TuningError } from './tuning-error';
export type { TuningIssue } from './tuning-error';
export { tuningLimits, sectionLimits, groupLimits, groupOptionalLimits, groupOptionalDefaults, curveLimits, groupsLimits, forbiddenKeys, topLevelKeys, isOptionalField } from './tuning-limits';
export type { FieldLimit, NumberField, EnumField, BooleanField, SectionName } from './tuning-limits';
export { version0Keys } from './migrate-tuning';
export { OPEN_CUTOFF_HZ, MAX_TIME_SCALE } from './tuning-types';
export type * from './tuning-types';
