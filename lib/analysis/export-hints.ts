/**
 * How to export a model we can read, by the file's kind, added to every message about a file we
 * could not take, so the client knows what to change in their CAD system. Common practice of CAD
 * exports, not any one program's menus.
 */
const HINTS: Record<string, string> = {
  stl: "To fix it: export the part again as binary STL of the closed solid (not surfaces), in millimetres or inches, and check the file is complete (a copy cut short by a sync tool or mail gateway is a common cause).",
  obj: "To fix it: export the part again as OBJ with vertices and faces only (v and f lines), triangulated, from the closed solid.",
  "3mf": "To fix it: export the part again as 3MF with its model units set, from the closed solid.",
  step: "To fix it: export the part again as STEP (AP214 or AP242) with solid bodies, not surfaces or a drawing; if the assembly is large, export only the bodies to print.",
  iges: "To fix it: export the part again as IGES with trimmed surfaces or solids; STEP with solid bodies is the better choice if your CAD system offers it.",
};
const FAMILY: Record<string, string> = { stl: "stl", obj: "obj", "3mf": "3mf", step: "step", stp: "step", igs: "iges", iges: "iges" };
const ANY = "To fix it: send STL, OBJ, 3MF, STEP (.step, .stp) or IGES (.igs, .iges), exported from the closed solid.";

/** Error-code prefixes about the file's content in general (not one format). */
const ABOUT_THE_FILE = new Set(["mesh", "file", "zip", "model"]);

/**
 * The export advice for a file name (by its extension) or an engine error code ("stl:truncated");
 * "" for codes that are not about the file (a busy estimator, a time limit).
 */
export function exportHint(fileNameOrCode: string | null | undefined): string {
  const s = (fileNameOrCode ?? "").toLowerCase();
  const isCode = s.includes(":");
  const key = isCode ? s.slice(0, s.indexOf(":")) : s.includes(".") ? s.slice(s.lastIndexOf(".") + 1) : s;
  const family = FAMILY[key];
  if (family) return HINTS[family]!;
  if (isCode) return ABOUT_THE_FILE.has(key) ? ANY : "";
  return s.includes(".") ? ANY : "";
}
