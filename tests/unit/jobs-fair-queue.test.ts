import { describe, expect, it } from "vitest";
import { FairQueue } from "@/lib/jobs/fair-queue";

// Source: the fair-share policy stated in README's reliability section (lib/jobs/fair-queue.ts).
describe("the fair queue of the job pool", () => {
  it("takes turns between organisations instead of first come, first served", () => {
    const q = new FairQueue<string>({ workers: 1, maxThreads: 1, perOrg: 2 });
    for (let i = 0; i < 5; i++) q.push(1, `a${i}`);
    q.push(2, "b0");
    expect(q.next()?.item).toBe("a0");
    expect(q.next()).toBeNull(); // one worker, busy
    q.done(1);
    expect(q.next()?.item).toBe("b0"); // the organisation with nothing running goes first
    q.done(2);
    expect(q.next()?.item).toBe("a1");
  });

  it("starts an idle organisation's first job on an extra thread while the workers are busy, up to the thread limit", () => {
    const q = new FairQueue<string>({ workers: 1, maxThreads: 2, perOrg: 2 });
    q.push(1, "a0");
    q.push(1, "a1");
    q.push(2, "b0");
    q.push(3, "c0");
    expect(q.next()?.item).toBe("a0");
    expect(q.next()?.item).toBe("b0"); // extra thread: organisation 2 had nothing running
    expect(q.next()).toBeNull(); // two threads in all
    q.done(1);
    expect(q.next()?.item).toBe("c0"); // nothing running in 1 and 3: 3 was never served, 1 was
    expect(q.stats()).toEqual({ running: 2, waiting: 1 });
  });

  it("never runs more than perOrg jobs of one organisation, and drops a cancelled waiting job", () => {
    const q = new FairQueue<string>({ workers: 4, maxThreads: 4, perOrg: 2 });
    ["a0", "a1", "a2"].forEach((x) => q.push(1, x));
    expect(q.next()?.item).toBe("a0");
    expect(q.next()?.item).toBe("a1");
    expect(q.next()).toBeNull();
    expect(q.remove("a2")).toBe(true);
    expect(q.remove("a0")).toBe(false); // already started
    q.done(1);
    expect(q.next()).toBeNull();
    expect(q.stats()).toEqual({ running: 1, waiting: 0 });
  });
});
