import { describe, expect, it } from "vitest";
import { safeCallbackPath } from "./auth";

describe("post-sign-in destination", () => {
  it.each([
    ["/portal", "/portal"],
    ["/portal/requests/abc?tab=files#top", "/portal/requests/abc?tab=files#top"],
    ["/admin/../portal", "/portal"],
  ])("keeps a path on this site: %s", (given, kept) => {
    expect(safeCallbackPath(given)).toBe(kept);
  });

  it.each([
    "/\t/evil.example/pwned", // the tab is dropped by browsers: //evil.example
    "/\n/evil.example",
    "/\r/evil.example",
    "/ /evil.example",
    "//evil.example",
    "/\\evil.example",
    "/\\/evil.example",
    "https://evil.example/",
    "javascript:alert(1)",
    "portal",
    "",
    null,
    undefined,
    `/${"a".repeat(600)}`,
  ])("refuses %j", (given) => {
    expect(safeCallbackPath(given)).toBeNull();
  });
});
