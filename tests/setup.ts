/**
 * Property tests are reproducible by default: every fast-check run starts from the same fixed
 * state unless FURROW_FC_RANDOM=1 asks for fresh random inputs (for exploratory runs; a failure
 * then prints the value needed to replay it).
 */
import fc from 'fast-check';

if (process.env.FURROW_FC_RANDOM !== '1') fc.configureGlobal({ seed: 20261202 });
