/**
 * Reader for NIST StRD nonlinear-regression .dat files (certified values parsed from the header).
 * The data are committed in tests/reference/nist-strd/ (US-government public-domain data, see its README).
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

export interface NistDataset {
  name: string;
  starts: [number[], number[]];
  certified: number[];
  certifiedStdDev: number[];
  rss: number;
  residualStdDev: number;
  x: number[];
  y: number[];
}

const here = path.dirname(fileURLToPath(import.meta.url));

/** Folder holding the .dat files (committed beside this reader). */
export function nistFolder(): string {
  return path.join(here, 'nist-strd');
}

const num = (s: string): number => Number(s.replace(/E/i, 'e'));

export function readNist(name: string): NistDataset {
  const text = readFileSync(path.join(nistFolder(), `${name}.dat`), 'utf8');
  const lines = text.split(/\r?\n/);
  const starts: [number[], number[]] = [[], []];
  const certified: number[] = [];
  const sd: number[] = [];
  let rss = NaN;
  let rsd = NaN;
  const x: number[] = [];
  const y: number[] = [];
  let inData = false;
  for (const line of lines) {
    const pm = /^\s*b\d+\s*=\s*(\S+)\s+(\S+)\s+(\S+)\s+(\S+)/.exec(line);
    if (pm && !inData) {
      starts[0].push(num(pm[1]));
      starts[1].push(num(pm[2]));
      certified.push(num(pm[3]));
      sd.push(num(pm[4]));
      continue;
    }
    const rm = /Residual Sum of Squares:\s+(\S+)/.exec(line);
    if (rm) rss = num(rm[1]);
    const sm = /Residual Standard Deviation:\s+(\S+)/.exec(line);
    if (sm) rsd = num(sm[1]);
    if (/^Data:\s+y\s+x/.test(line)) {
      inData = true;
      continue;
    }
    if (inData) {
      const parts = line.trim().split(/\s+/);
      if (parts.length === 2) {
        y.push(num(parts[0]));
        x.push(num(parts[1]));
      }
    }
  }
  if (certified.length === 0 || x.length === 0 || !Number.isFinite(rss)) {
    throw new Error(`could not parse NIST StRD file ${name}.dat`);
  }
  return { name, starts, certified, certifiedStdDev: sd, rss, residualStdDev: rsd, x, y };
}
