// Placeholder until the sample scene lands: says what exists and how to run the benchmarks.
console.log('Ralenti: the sample scene is not built yet. Run `npm test` or `npm run bench`.');
