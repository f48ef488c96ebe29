import { describe, expect, it } from "vitest";
import { isSameOriginPath, safeCallbackPath } from "@/lib/security/redirect";

// Source: WHATWG URL Standard, "special" schemes treat "\" as a path separator and strip tab/LF/CR
// (https://url.spec.whatwg.org/#concept-basic-url-parser); OWASP Unvalidated Redirects cheat sheet.
describe("sign-in callbacks stay on this site", () => {
  it.each([
    "/\\evil.example",
    "/%5Cevil.example",
    "/%5cevil.example",
    "/%255Cevil.example",
    "//evil.example",
    "/%2Fevil.example",
    "/%2F%252Fevil.example",
    "/\t/evil.example",
    "/%09/evil.example",
    "/\n/evil.example",
    "https://evil.example/",
    "javascript:alert(1)",
    "evil.example",
    "",
    "/%E0%A4%A",
  ])("refuses %j", (url) => {
    expect(isSameOriginPath(url)).toBe(false);
    expect(safeCallbackPath(url)).toBe("/dashboard");
  });

  it.each(["/settings", "/lifts/12?tab=chain", "/scenarios/3#results", "/logbook?from=2026-01-01&to=2026-02-01", "/search?q=a%20b"])(
    "keeps the path %j",
    (url) => {
      expect(safeCallbackPath(url)).toBe(url);
    },
  );

  it("falls back to the dashboard without a callback", () => {
    expect(safeCallbackPath(undefined)).toBe("/dashboard");
    expect(safeCallbackPath(["/a", "/b"])).toBe("/dashboard");
  });
});
