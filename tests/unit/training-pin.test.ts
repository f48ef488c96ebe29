import { describe, expect, it } from "vitest";
import { activeCaption, pinnedAt } from "@/components/training/types";

describe("a caption pinned at the replay's moment", () => {
  it("takes the time the replay shows, to the hundredth of a second", () => {
    // Source: common practice, no source — the replay's read-out shows t to 0.01 s; the caption keeps that.
    expect(pinnedAt(12.3456, 40)).toBe(12.35);
    expect(pinnedAt(0.2, 40)).toBe(0.2);
  });

  it("stays within the run: never below 0 nor past its duration", () => {
    // Source: common practice, no source — the server refuses a caption beyond its run (lib/training/service.ts).
    expect(pinnedAt(-0.5, 40)).toBe(0);
    expect(pinnedAt(40.004, 40)).toBe(40);
    expect(pinnedAt(41, 37.456)).toBe(37.45);
  });

  it("shows in the player at that moment", () => {
    const at = pinnedAt(7.891, 40);
    // Source: common practice, no source — a caption shows from its moment on.
    expect(activeCaption([{ at, text: "pinned" }], 7.89)?.text).toBe("pinned");
    expect(activeCaption([{ at, text: "pinned" }], 7.88)).toBeNull();
  });
});
