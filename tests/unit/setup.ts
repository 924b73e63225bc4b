import fc from 'fast-check';

/**
 * Property tests run with a fixed seed unless FC_SEED says otherwise, so a run is repeatable;
 * fast-check puts the seed (and the path to the failing case) in every failure message, and
 * `verbose` adds the cases it tried.
 */
const seed = Number(process.env.FC_SEED ?? 20261202);
fc.configureGlobal({ seed, verbose: 1 });
