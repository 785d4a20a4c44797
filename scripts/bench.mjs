// Placeholder until the first benchmark lands.
console.log('No benchmarks yet.');
