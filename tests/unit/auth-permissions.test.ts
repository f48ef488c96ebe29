import { describe, expect, it } from "vitest";
import { can, PERMISSIONS, type Action } from "@/lib/auth/permissions";
import { ROLES, isRole, type Role } from "@/lib/auth/roles";
import { API_ROUTES, PAGE_ROUTES, patternFromFile } from "@/lib/auth/route-access";

// The table itself is the product's policy ("common practice, no source": least privilege per role);
// these checks pin the decisions README "Roles" states and keep the table and the route table consistent.

describe("permission table", () => {
  it("names only known roles", () => {
    for (const [action, roles] of Object.entries(PERMISSIONS)) {
      for (const r of roles) expect(isRole(r), `${action} lists unknown role ${r}`).toBe(true);
    }
  });

  it("lets only administrators manage people and read the development mailbox", () => {
    for (const role of ROLES) {
      expect(can(role, "users:manage")).toBe(role === "admin");
      expect(can(role, "devmail:read")).toBe(role === "admin");
    }
  });

  it("lets every role read design data and its own profile, and only admins and engineers write designs", () => {
    for (const role of ROLES) {
      expect(can(role, "design:read")).toBe(true);
      expect(can(role, "profile:self")).toBe(true);
      expect(can(role, "design:write")).toBe(role === "admin" || role === "engineer");
    }
  });

  it("keeps viewers away from every change to shared data", () => {
    const changes: Action[] = ["design:write", "run:start", "run:cancel", "run:delete", "comment:write", "users:manage"];
    for (const a of changes) expect(can("viewer", a), a).toBe(false);
  });

  it("answers false for a role missing from an action's list", () => {
    const role: Role = "trainer";
    expect(can(role, "run:delete")).toBe(false);
    expect(can(role, "run:start")).toBe(true);
  });
});

describe("route-access table", () => {
  it("uses only actions from the permission table", () => {
    const accesses = [
      ...Object.values(API_ROUTES).flatMap((r) => Object.values(r.methods)),
      ...Object.values(PAGE_ROUTES).map((p) => p.access),
    ];
    for (const a of accesses) {
      if (typeof a === "object") expect(Object.keys(PERMISSIONS)).toContain(a!.action);
      else expect(["public", "signed-in"]).toContain(a);
    }
  });

  it("turns files under app/ into URL patterns without route groups", () => {
    expect(patternFromFile("page.tsx")).toBe("/");
    expect(patternFromFile("(workspace)/lifts/page.tsx")).toBe("/lifts");
    expect(patternFromFile("(workspace)/admin/users/page.tsx")).toBe("/admin/users");
    expect(patternFromFile("api/admin/users/[id]/route.ts")).toBe("/api/admin/users/[id]");
    expect(patternFromFile("api/auth/[...nextauth]/route.ts")).toBe("/api/auth/[...nextauth]");
  });

  it("keeps the people admin pages for administrators only", () => {
    expect(PAGE_ROUTES["/admin/users"].access).toEqual({ action: "users:manage" });
    expect(API_ROUTES["/api/admin/users/[id]"].methods.PATCH).toEqual({ action: "users:manage" });
  });
});
