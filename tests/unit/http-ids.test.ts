import { describe, expect, it } from "vitest";
import { HttpError } from "@/lib/http/errors";
import { parseId, toId } from "@/lib/http/ids";
import { queryId } from "@/lib/http/list-query";

describe("one id parser for paths and query strings", () => {
  it.each(["0x10", "1e3", "010", "+5", "1.0", " 7", "7 ", "0", "-3", "4294967296", "99999999999", "", "١٢"])("refuses %j", (raw) => {
    expect(toId(raw)).toBeNull();
    expect(() => parseId(raw, "Lift not found.")).toThrow(HttpError);
    expect(queryId("liftId").safeParse(raw).success).toBe(false);
  });

  it.each([
    ["1", 1],
    ["42", 42],
    ["4294967295", 4_294_967_295],
  ])("reads %j as %d", (raw, id) => {
    expect(toId(raw)).toBe(id);
    expect(parseId(raw)).toBe(id);
    expect(queryId("liftId").parse(raw)).toBe(id);
  });

  it("a refused path id answers 404 with the route's own words", () => {
    const err = (() => {
      try {
        parseId("0x10", "Run not found.");
      } catch (e) {
        return e as HttpError;
      }
    })();
    expect(err?.status).toBe(404);
    expect(err?.message).toBe("Run not found.");
  });
});
