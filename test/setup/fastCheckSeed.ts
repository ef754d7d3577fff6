/**
 * Property tests run with a fixed seed, so `npm test` gives the same result on every machine and
 * in CI. To explore new cases, run with another seed: `FC_SEED=123 npx vitest run test/physics`
 * (a failure prints its seed and path for fast-check to replay).
 */
import fc from 'fast-check';

const seed = Number(process.env.FC_SEED ?? 20261202);
fc.configureGlobal({ seed: Number.isInteger(seed) ? seed : 20261202 });
