/**
 * Bytes of an input file -> text, with the encoding detected and named as in the WHATWG Encoding
 * Standard (https://encoding.spec.whatwg.org/): a byte-order mark selects UTF-8, UTF-16LE or
 * UTF-16BE; without one, bytes that are valid UTF-8 are read as UTF-8 and anything else as
 * windows-1252 (the standard's decoder for the "latin1" and "iso-8859-1" labels, which covers
 * the degree and micro signs of spreadsheet exports). A NUL byte outside UTF-16 text means the
 * file is binary: it is refused at once, as is a file above the size limit.
 */
import { RateloomError } from '../core/errors.js';
import { checkArgs, is } from '../core/args.js';

/** Encodings rateloom detects, by their WHATWG Encoding Standard names. */
export type InputEncoding = 'UTF-8' | 'UTF-16LE' | 'UTF-16BE' | 'windows-1252';

/** Default largest input file, bytes (256 MiB: about 3 million rows of a typical lab CSV). */
export const DEFAULT_MAX_INPUT_BYTES = 256 * 1024 * 1024;

export interface DecodedText {
  text: string;
  encoding: InputEncoding;
}

/** The BOM at the start of `bytes`, if any, with its length. */
export function sniffBom(bytes: Uint8Array): { encoding: InputEncoding; length: number } | undefined {
  checkArgs('sniffBom', [bytes], [{ name: 'bytes', check: is.bytes }]);
  if (bytes.length >= 3 && bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf) return { encoding: 'UTF-8', length: 3 };
  if (bytes.length >= 2 && bytes[0] === 0xff && bytes[1] === 0xfe) return { encoding: 'UTF-16LE', length: 2 };
  if (bytes.length >= 2 && bytes[0] === 0xfe && bytes[1] === 0xff) return { encoding: 'UTF-16BE', length: 2 };
  return undefined;
}

/** 1-based line of byte offset `at` (counting 0x0A bytes). */
function lineOfByte(bytes: Uint8Array, at: number): number {
  let line = 1;
  for (let k = 0; k < at; k++) if (bytes[k] === 10) line++;
  return line;
}

/** The error for a NUL byte at `line` of `file`. */
export function nulError(file: string, line: number): RateloomError {
  return new RateloomError('E_FILE', `'${file}' contains a NUL byte (line ${line}): it is a binary file, not text`, {
    location: { file, line },
    fix: 'Give a text file (CSV or JSON). A UTF-16 text file needs its byte-order mark; or save it as UTF-8.',
  });
}

/** The error for a file larger than `limit` bytes. */
export function tooLargeError(file: string, limit: number): RateloomError {
  return new RateloomError('E_FILE', `'${file}' is larger than the input limit of ${Math.round(limit / 1048576)} MiB`, {
    location: { file },
    fix: 'Split the file, or raise the limit with the environment variable RATELOOM_MAX_INPUT_MB (in MiB).',
  });
}

/** Decode input bytes (see the file comment). `file` is only used in messages. */
export function decodeInput(bytes: Uint8Array, file: string, maxBytes = DEFAULT_MAX_INPUT_BYTES): DecodedText {
  checkArgs('decodeInput', [bytes, file, maxBytes], [{ name: 'bytes', check: is.bytes }, { name: 'file', check: is.text }, { name: 'maxBytes', check: is.positive }]);
  if (bytes.length > maxBytes) throw tooLargeError(file, maxBytes);
  const bom = sniffBom(bytes);
  const body = bom ? bytes.subarray(bom.length) : bytes;
  if (bom && bom.encoding !== 'UTF-8') {
    const text = new TextDecoder(bom.encoding.toLowerCase()).decode(body);
    const nul = text.indexOf('\u0000');
    if (nul >= 0) throw nulError(file, text.slice(0, nul).split('\n').length);
    return { text, encoding: bom.encoding };
  }
  const nul = body.indexOf(0);
  if (nul >= 0) throw nulError(file, lineOfByte(body, nul));
  try {
    return { text: new TextDecoder('utf-8', { fatal: true }).decode(body), encoding: 'UTF-8' };
  } catch {
    if (bom) throw new RateloomError('E_FILE', `'${file}' starts with a UTF-8 byte-order mark but is not valid UTF-8`, { location: { file }, fix: 'Save the file again as UTF-8.' });
    return { text: new TextDecoder('windows-1252').decode(body), encoding: 'windows-1252' };
  }
}
