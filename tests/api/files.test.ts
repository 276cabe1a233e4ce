/**
 * One reader for every input file: the commands (cli/io.ts) and the path-taking library entry
 * points (loadStudy(path) & co., src/api/files.ts) share the same code, so they refuse the same
 * files the same way: size limit (RATELOOM_MAX_INPUT_MB), NUL bytes, encodings with a BOM.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, afterEach, describe, expect, it } from 'vitest';
import * as cliIo from '../../cli/io';
import { loadStudy, readText } from '../../src/index';

const dir = mkdtempSync(join(tmpdir(), 'rateloom-files-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
afterEach(() => {
  delete process.env.RATELOOM_MAX_INPUT_MB;
});
const caught = (f: () => unknown) => {
  try {
    f();
  } catch (e) {
    return e as { code: string; message: string };
  }
  throw new Error('no error');
};
const demo = join(import.meta.dirname, '../../datasets-demo/pbr/pbr.study.json');

describe('one file reader for the commands and the library', () => {
  it('cli/io reads with the library functions themselves', () => {
    expect(cliIo.readText).toBe(readText);
  });

  it('loadStudy(path) honours RATELOOM_MAX_INPUT_MB like the commands', () => {
    process.env.RATELOOM_MAX_INPUT_MB = '0.001';
    const e = caught(() => loadStudy(demo));
    expect(e.code).toBe('E_FILE');
    expect(e.message).toMatch(/larger than the input limit/);
  });

  it('a NUL byte is refused as a binary file, a UTF-16 file with its BOM is read', () => {
    const bin = join(dir, 'bin.json');
    writeFileSync(bin, Buffer.from([0x7b, 0x0a, 0x00, 0x7d]));
    expect(caught(() => readText(bin)).message).toMatch(/NUL byte \(line 2\)/);
    const u16 = join(dir, 'u16.json');
    writeFileSync(u16, Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from('{"a": 1}', 'utf16le')]));
    expect(readText(u16)).toBe('{"a": 1}');
  });

  it('a folder is named as a folder', () => {
    expect(caught(() => readText(dir, 'study file')).message).toMatch(/is a folder, not a file/);
  });
});
