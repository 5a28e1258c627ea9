import { describe, expect, it } from "vitest";
import { exportHint } from "./export-hints";

describe("exportHint", () => {
  it("advises by the file's extension or the engine's error code", () => {
    expect(exportHint("hull-plug.STL")).toMatch(/binary STL/);
    expect(exportHint("rib.stp")).toMatch(/AP214 or AP242/);
    expect(exportHint("stl:truncated")).toMatch(/binary STL/);
    expect(exportHint("iges:kernel-error")).toMatch(/IGES/);
    expect(exportHint("notes.docx")).toMatch(/send STL, OBJ, 3MF, STEP/);
    expect(exportHint("mesh:bad-coordinate")).toMatch(/send STL/);
    // Not about the file: no advice to re-export.
    expect(exportHint("timeout:estimate")).toBe("");
    expect(exportHint("unavailable:estimator")).toBe("");
    expect(exportHint("bad_gateway:storage")).toBe("");
    expect(exportHint("busy")).toBe("");
    expect(exportHint(null)).toBe("");
  });
});
