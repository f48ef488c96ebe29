/**
 * At most `limit()` holders per organisation at once; the next in line gets a freed place straight away
 * (first come, first served within the organisation). In-process only.
 */
export class OrgLimiter {
  private readonly entries = new Map<number, { active: number; waiting: (() => void)[] }>();

  constructor(private readonly limit: () => number) {}

  async acquire(organisationId: number): Promise<() => void> {
    let entry = this.entries.get(organisationId);
    if (!entry) this.entries.set(organisationId, (entry = { active: 0, waiting: [] }));
    const e = entry;
    if (e.active >= this.limit()) await new Promise<void>((resolve) => e.waiting.push(resolve));
    else e.active += 1;
    let released = false;
    return () => {
      if (released) return;
      released = true;
      const next = e.waiting.shift();
      if (next) return next(); // hand the place straight on
      e.active -= 1;
      if (e.active === 0) this.entries.delete(organisationId);
    };
  }
}
