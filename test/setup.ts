/**
 * Property tests draw from one fixed seed unless a test gives its own, so a
 * run on a clean clone draws the same cases as every run before it.
 */
import fc from 'fast-check';

fc.configureGlobal({ seed: 20261202 });
