import fc from 'fast-check';

// Property tests explore new random cases on every local run; in CI (CI=true) they replay a fixed
// seed so a run is reproducible and a rare case found locally becomes a regression test instead
// of a surprise. FC_SEED replays any seed a failure printed.
const seed = process.env.FC_SEED ? Number(process.env.FC_SEED) : process.env.CI ? 20261201 : undefined;
if (seed !== undefined) fc.configureGlobal({ seed });
