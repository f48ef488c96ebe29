import { describe, expect, it } from "vitest";
import { brokenTextIssues } from "@/lib/http/text";

describe("text check of deeply nested bodies", () => {
  it("walks 200,000 levels of nesting without overflowing the stack and names the bad string's path", () => {
    let body: unknown = "bad\u0000text";
    for (let i = 0; i < 200_000; i++) body = [body];
    const issues = brokenTextIssues(body);
    expect(issues).toHaveLength(1);
    expect(issues[0]!.path.split(".")).toHaveLength(200_000);
    expect(issues[0]!.message).toContain("control characters");
  });

  it("names a bad key and a lone surrogate in a value with their dotted paths", () => {
    expect(brokenTextIssues({ a: { "k\u001b": 1, b: ["ok", "\ud800"] } })).toEqual([
      { path: "a.k\u001b", message: "must not contain control characters (NUL, ESC and the like)" },
      { path: "a.b.1", message: "is not valid Unicode text (a lone UTF-16 surrogate)" },
    ]);
  });
});
