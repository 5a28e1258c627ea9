import { EstimateInputError } from "../errors";

/**
 * A byte-level check of a STEP physical file (ISO 10303-21, "clear text encoding of the
 * exchange structure") before it reaches the CAD kernel. The kernel skips entities it cannot
 * resolve and still answers "success" with faces missing (seen with occt-import-js 0.0.23: a
 * deleted surface entity gave 48 of 84 triangles), so a broken entity list is found here and
 * refused with its line number rather than measured as a wrong volume.
 *
 * Two passes over the bytes, allocating nothing per entity beyond one slot in the index:
 * pass 1 records where each `#id =` is defined (refusing duplicates, unbalanced parentheses,
 * control bytes outside strings); pass 2 checks every `#id` reference against that index.
 */

const Q = 0x27; // '
const SEMI = 0x3b;
const HASH = 0x23;
const EQ = 0x3d;
const LP = 0x28;
const RP = 0x29;
const SLASH = 0x2f;
const STAR = 0x2a;
const NL = 0x0a;

function isDigit(c: number): boolean {
  return c >= 0x30 && c <= 0x39;
}
function isSpace(c: number): boolean {
  return c === 0x20 || c === 0x09 || c === 0x0a || c === 0x0d || c === 0x0c;
}

/** Where each entity is defined: a typed array for dense ids, a Map for the odd huge one. */
export class EntityIndex {
  private dense: Uint32Array;
  private sparse = new Map<number, number>();
  count = 0;
  constructor(private readonly denseLimit: number) {
    this.dense = new Uint32Array(Math.min(denseLimit, 1 << 16));
  }
  /** Byte offset of the statement defining `id`, or -1. */
  get(id: number): number {
    if (id < this.denseLimit) return id < this.dense.length ? this.dense[id]! - 1 : -1;
    const v = this.sparse.get(id);
    return v === undefined ? -1 : v;
  }
  set(id: number, offset: number): boolean {
    if (this.get(id) >= 0) return false;
    if (id < this.denseLimit) {
      if (id >= this.dense.length) {
        const grown = new Uint32Array(Math.min(this.denseLimit, Math.max(id + 1, this.dense.length * 2)));
        grown.set(this.dense);
        this.dense = grown;
      }
      this.dense[id] = offset + 1;
    } else {
      this.sparse.set(id, offset);
    }
    this.count++;
    return true;
  }
}

function fail(code: string, message: string): never {
  throw new EstimateInputError(`step:${code}`, message);
}

/**
 * Scan the DATA section [start, end). Pass 1 fills `index`; pass 2 checks references.
 * Errors name the line (1-based) counted from `firstLine`.
 */
function scanData(bytes: Uint8Array, start: number, end: number, firstLine: number, index: EntityIndex, pass: 1 | 2): void {
  let line = firstLine;
  let inString = false;
  let depth = 0;
  let atStatementStart = true;
  let stmtLine = line;
  let i = start;
  while (i < end) {
    const c = bytes[i]!;
    if (c === NL) line++;
    if (inString) {
      if (c === Q) inString = false; // '' (an escaped quote) closes and reopens: same result
      i++;
      continue;
    }
    if (c === SLASH && bytes[i + 1] === STAR) {
      const close = findCommentEnd(bytes, i + 2, end);
      for (let k = i; k < close; k++) if (bytes[k] === NL) line++;
      i = close;
      continue;
    }
    if (atStatementStart) {
      if (isSpace(c)) {
        i++;
        continue;
      }
      atStatementStart = false;
      stmtLine = line;
      if (c !== HASH) badStart(line);
      let j = i + 1;
      let id = 0;
      while (j < end && isDigit(bytes[j]!) && id < 1e12) id = id * 10 + (bytes[j++]! - 0x30);
      const noDigits = j === i + 1;
      while (j < end && isSpace(bytes[j]!)) j++;
      if (noDigits || bytes[j] !== EQ) badStart(line);
      if (id > 0xffffffff) fail("broken-entity", `The STEP file's entity list is broken at line ${line}: entity number ${id} is out of range.`);
      if (pass === 1 && !index.set(id, i)) fail("broken-entity", `The STEP file's entity list is broken: entity #${id} is defined twice (line ${line}).`);
      i = j + 1;
      continue;
    }
    if (c === Q) inString = true;
    else if (c === LP) depth++;
    else if (c === RP) {
      if (--depth < 0) fail("broken-entity", `The STEP file's entity list is broken at line ${line}: a ")" closes nothing.`);
    } else if (c === SEMI) {
      if (depth !== 0) fail("broken-entity", `The STEP file's entity list is broken: the statement starting at line ${stmtLine} has unbalanced parentheses.`);
      atStatementStart = true;
    } else if (c === HASH && pass === 2) {
      let j = i + 1;
      let id = 0;
      while (j < end && isDigit(bytes[j]!) && id < 1e12) id = id * 10 + (bytes[j++]! - 0x30);
      if (j > i + 1 && index.get(id) < 0) fail("broken-entity", `The STEP file's entity list is broken: line ${line} refers to entity #${id}, which the file never defines.`);
      i = j;
      continue;
    } else if (c < 0x20 && !isSpace(c)) {
      fail("binary", `The file is not a STEP text file: it has binary bytes at line ${line}.`);
    }
    i++;
  }
  if (inString) fail("truncated", "The STEP file ends inside a quoted string: it is truncated or broken.");
  if (!atStatementStart) fail("truncated", `The STEP file's last statement (line ${stmtLine}) has no closing ";": the file is truncated.`);
}

function badStart(line: number): never {
  return fail("broken-entity", `The STEP file's entity list is broken at line ${line}: a statement there does not start with "#number =".`);
}

function findCommentEnd(bytes: Uint8Array, from: number, end: number): number {
  for (let k = from; k + 1 < end; k++) if (bytes[k] === STAR && bytes[k + 1] === SLASH) return k + 2;
  return fail("truncated", "The STEP file ends inside a comment: it is truncated.");
}

export interface StepLayout {
  /** Byte range of the DATA section's content (after "DATA;", before its "ENDSEC;"). */
  dataStart: number;
  dataEnd: number;
  index: EntityIndex;
  /** FILE_SCHEMA's first name, e.g. "AUTOMOTIVE_DESIGN" (AP214), "CONFIG_CONTROL_DESIGN" (AP203). */
  schema: string;
}

/** Check the framing (ISO-10303-21; … HEADER; … DATA; … ENDSEC; END-ISO-10303-21;) and the entity list. */
export function scanStep(bytes: Uint8Array): StepLayout {
  const text = (from: number, to: number) => Buffer.from(bytes.buffer, bytes.byteOffset + from, Math.max(0, to - from)).toString("latin1");
  let s = 0;
  if (bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf) s = 3;
  while (s < bytes.length && isSpace(bytes[s]!)) s++;
  if (s >= bytes.length) fail("empty", "The STEP file is empty.");
  if (bytes[s] === 0x50 && bytes[s + 1] === 0x4b) fail("compressed", "The file is a zip archive, not a plain STEP file: unzip it and upload the .step inside.");
  if (bytes[s] === 0x1f && bytes[s + 1] === 0x8b) fail("compressed", "The file is gzip-compressed, not a plain STEP file: decompress it and upload the .step.");
  const head = text(s, Math.min(bytes.length, s + 64));
  if (head.startsWith("<?xml") || head.startsWith("ISO-10303-28")) fail("xml", "The file is STEP-XML (ISO 10303-28); export the part as a plain STEP file (ISO 10303-21) instead.");
  if (!head.startsWith("ISO-10303-21;")) fail("not-step", 'The file is not a STEP file: it does not begin with "ISO-10303-21;".');

  let e = bytes.length;
  while (e > s && (isSpace(bytes[e - 1]!) || bytes[e - 1] === 0 || bytes[e - 1] === 0x1a)) e--;
  const tail = text(Math.max(s, e - 40), e).replace(/\s+/g, "");
  if (!tail.endsWith("END-ISO-10303-21;")) fail("truncated", 'The STEP file is truncated: it does not end with "END-ISO-10303-21;".');

  const buf = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const dataKw = findKeyword(buf, "DATA;", s, e);
  if (dataKw < 0) fail("no-data", 'The STEP file has no "DATA;" section.');
  const headerText = text(s, dataKw);
  if (!/HEADER\s*;/.test(headerText) || !/ENDSEC\s*;/.test(headerText)) fail("no-header", "The STEP file's HEADER section is missing or not closed.");
  const schema = /FILE_SCHEMA\s*\(\s*\(\s*'([^'{\s]*)/.exec(headerText)?.[1] ?? "";
  const endIso = buf.lastIndexOf("END-ISO-10303-21", e);
  const dataEnd = buf.lastIndexOf("ENDSEC", endIso);
  if (dataEnd < dataKw) fail("truncated", 'The STEP file\'s DATA section is not closed by "ENDSEC;".');
  const dataStart = dataKw + 5;
  let firstLine = 1;
  for (let k = 0; k < dataStart; k++) if (bytes[k] === NL) firstLine++;

  // Ids are usually dense from 1; a typed array up to a few per byte, a Map beyond.
  const index = new EntityIndex(Math.max(1 << 16, Math.min(bytes.length * 2, 1 << 26)));
  scanData(bytes, dataStart, dataEnd, firstLine, index, 1);
  if (index.count === 0) fail("empty", "The STEP file's DATA section has no entities.");
  scanData(bytes, dataStart, dataEnd, firstLine, index, 2);
  return { dataStart, dataEnd, index, schema };
}

/** Offset of `kw` where it starts a statement (preceded by whitespace or ";"), or -1. */
function findKeyword(buf: Buffer, kw: string, from: number, to: number): number {
  let k = buf.indexOf(kw, from);
  while (k >= 0 && k < to) {
    const p = k > 0 ? buf[k - 1]! : SEMI;
    if (p === SEMI || isSpace(p)) return k;
    k = buf.indexOf(kw, k + 1);
  }
  return -1;
}

/** The statement text starting at `offset` up to its ";" (outside strings), at most `max` bytes. */
export function statementAt(bytes: Uint8Array, offset: number, max = 4096): string {
  let inString = false;
  let k = offset;
  const end = Math.min(bytes.length, offset + max);
  for (; k < end; k++) {
    const c = bytes[k]!;
    if (c === Q) inString = !inString;
    else if (c === SEMI && !inString) break;
  }
  return Buffer.from(bytes.buffer, bytes.byteOffset + offset, k - offset).toString("latin1");
}
