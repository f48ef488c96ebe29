import { describe, expect, it } from "vitest";
import { likePattern, listQuerySchema, pageOptions, MAX_PAGE_SIZE } from "@/lib/http/list-query";

const schema = listQuerySchema({ sortFields: ["name", "createdAt"], defaultSort: "name", filters: {} });

describe("list query", () => {
  it("fills defaults and coerces numbers from the query string", () => {
    expect(schema.parse({})).toEqual({ page: 1, pageSize: 20, sort: "name", order: "asc" });
    expect(schema.parse({ page: "3", pageSize: "50", sort: "createdAt", order: "desc", q: " chain " })).toEqual({
      page: 3,
      pageSize: 50,
      sort: "createdAt",
      order: "desc",
      q: "chain",
    });
  });

  it("names the field of every bad parameter", () => {
    const r = schema.safeParse({ page: "0", pageSize: String(MAX_PAGE_SIZE + 1), sort: "password_hash", order: "up" });
    expect(r.success).toBe(false);
    expect(r.error!.issues.map((i) => i.path.join(".")).sort()).toEqual(["order", "page", "pageSize", "sort"]);
  });

  it("turns a page into limit/offset with id as tie-break, and escapes LIKE wildcards", () => {
    expect(pageOptions({ page: 3, pageSize: 10, sort: "name", order: "desc" })).toEqual({
      limit: 10,
      offset: 20,
      order: [["name", "DESC"], ["id", "DESC"]],
    });
    expect(likePattern("50%_a\\b")).toBe("%50\\%\\_a\\\\b%");
  });
});
