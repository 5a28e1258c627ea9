/**
 * Which model format do these bytes hold? Decided by content, never by the file name, so a
 * renamed file is caught before the engine sees it. Returns null for anything else.
 */
export type SniffedFormat = "stl-binary" | "stl-ascii" | "obj" | "3mf" | "step" | "iges";

const ascii = (b: Uint8Array, n: number) => {
  let s = "";
  for (let i = 0; i < Math.min(n, b.length); i++) s += String.fromCharCode(b[i]!);
  return s;
};

/** Bytes of a file's beginning that decide its format (the text formats' first 4 KiB, STL's 84-byte header). */
export const SNIFF_HEAD_BYTES = 4096;

/**
 * `bytes` may be the whole file or only its first SNIFF_HEAD_BYTES; `totalBytes` is the whole
 * file's length (binary STL is recognised by its facet count agreeing with that length).
 */
export function sniffModelFormat(bytes: Uint8Array, totalBytes: number = bytes.length): SniffedFormat | null {
  if (bytes.length < 4) return null;
  // ZIP local file header "PK\x03\x04" (APPNOTE 4.3.7): 3MF is an OPC zip package.
  if (bytes[0] === 0x50 && bytes[1] === 0x4b && bytes[2] === 0x03 && bytes[3] === 0x04) return "3mf";
  // Binary STL: 80-byte header, uint32 count, 50 bytes per facet; the size must agree exactly.
  if (bytes.length >= 84) {
    const n = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength).getUint32(80, true);
    if (n > 0 && 84 + 50 * n === totalBytes) return "stl-binary";
  }
  const head = ascii(bytes, 4096).replace(/^\uFEFF|^\xEF\xBB\xBF/, "");
  const trimmed = head.trimStart();
  // ISO 10303-21 exchange structure begins with the keyword "ISO-10303-21;".
  if (/^ISO-10303-21\s*;/.test(trimmed)) return "step";
  // IGES 5.3: fixed 80-column records; column 73 holds the section letter, the file opens with S (or F/C).
  const firstLine = head.split(/\r?\n/, 1)[0] ?? "";
  if (firstLine.length >= 73 && /[SFC]/.test(firstLine[72]!) && /^\s*\d+$/.test(firstLine.slice(73, 80))) return "iges";
  if (/^solid\b/i.test(trimmed) && /\bfacet\s+normal\b/i.test(head)) return "stl-ascii";
  if (/^(?:\s*(?:#.*|v|vn|vt|f|o|g|mtllib|usemtl|s)\b.*\r?\n)+/m.test(trimmed) && /^v\s+[-+\d.eE]+\s+/m.test(head)) return "obj";
  // A tiny ASCII STL may carry its first facet after a long name; check the whole text cheaply.
  if (/^solid\b/i.test(trimmed) && totalBytes < 4096 && /\bendsolid\b/i.test(head)) return "stl-ascii";
  return null;
}

const EXT_FAMILY: Record<string, SniffedFormat[]> = {
  stl: ["stl-binary", "stl-ascii"],
  obj: ["obj"],
  "3mf": ["3mf"],
  step: ["step"],
  stp: ["step"],
  igs: ["iges"],
  iges: ["iges"],
};

export const MODEL_EXTENSIONS = Object.keys(EXT_FAMILY);

/**
 * Check an uploaded model: the content must be a model format, and agree with the extension
 * (the engine picks its reader from the extension). Returns the format or a plain message.
 */
export function checkModelUpload(bytes: Uint8Array, fileName: string, totalBytes: number = bytes.length): { ok: true; format: SniffedFormat } | { ok: false; message: string } {
  const ext = fileName.includes(".") ? fileName.slice(fileName.lastIndexOf(".") + 1).toLowerCase() : "";
  const family = EXT_FAMILY[ext];
  if (!family) return { ok: false, message: `“${fileName}” is not a model file we read. Send STL, OBJ, 3MF, STEP (.step, .stp) or IGES (.igs, .iges).` };
  if (totalBytes === 0) return { ok: false, message: `“${fileName}” is empty.` };
  const found = sniffModelFormat(bytes, totalBytes);
  if (!found) return { ok: false, message: `“${fileName}” does not contain ${ext.toUpperCase()} data: its content is not a model file we recognise.` };
  if (!family.includes(found)) {
    return { ok: false, message: `“${fileName}” is named .${ext} but holds ${found.startsWith("stl") ? "STL" : found.toUpperCase()} data. Rename it to match, or export it again.` };
  }
  return { ok: true, format: found };
}
