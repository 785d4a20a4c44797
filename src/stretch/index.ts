// Public names of src/stretch: real-time time-scale modification (WSOLA grains read by the band-limited resampler).
export { StretchReader, stretchReaderDefaults } from './stretch-reader';
export type { StretchReaderOptions } from './stretch-reader';
export { SimilaritySearch, SEARCH_COARSE_RATE } from './similarity-search';
