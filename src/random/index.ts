// Public names of src/random: seeded pseudo-random numbers for procedural content and tests.
export { seededRandom } from './seeded-random';
