/**
 * The NIST StRD linear least-squares data sets embedded under tests/reference/nist-strd/
 * (public domain, https://www.itl.nist.gov/div898/strd/lls/lls.shtml), parsed, with the
 * log relative error used to state how many digits agree (NIST's own measure: LRE =
 * −log10(|estimate − certified| / |certified|), or −log10|estimate| when certified is 0).
 */
import norris from '../reference/nist-strd/Norris.dat?raw';
import pontius from '../reference/nist-strd/Pontius.dat?raw';
import longley from '../reference/nist-strd/Longley.dat?raw';
import filip from '../reference/nist-strd/Filip.dat?raw';
import wampler1 from '../reference/nist-strd/Wampler1.dat?raw';
import wampler2 from '../reference/nist-strd/Wampler2.dat?raw';
import wampler3 from '../reference/nist-strd/Wampler3.dat?raw';
import wampler4 from '../reference/nist-strd/Wampler4.dat?raw';
import wampler5 from '../reference/nist-strd/Wampler5.dat?raw';
import { readNistStrdFile, type NistStrdFile } from './nistStrdFile.js';

export const NIST_STRD: Record<string, NistStrdFile> = Object.fromEntries(
  Object.entries({
    Norris: norris,
    Pontius: pontius,
    Longley: longley,
    Filip: filip,
    Wampler1: wampler1,
    Wampler2: wampler2,
    Wampler3: wampler3,
    Wampler4: wampler4,
    Wampler5: wampler5,
  }).map(([name, text]) => [name, readNistStrdFile(name, text)]),
);

/** Polynomial sets: one predictor x, model B0 + B1 x + … (Longley has six predictors). */
export const POLYNOMIAL_SETS = ['Norris', 'Pontius', 'Filip', 'Wampler1', 'Wampler2', 'Wampler3', 'Wampler4', 'Wampler5'];

/** Digits of agreement (capped at 15, double precision). */
export function logRelativeError(estimate: number, certified: number): number {
  if (estimate === certified) return 15;
  const error = certified === 0 ? Math.abs(estimate) : Math.abs(estimate - certified) / Math.abs(certified);
  return Math.min(15, -Math.log10(error));
}
