/**
 * Which waiting job starts next, so one organisation cannot starve another. Pure bookkeeping (no threads,
 * no timers): the job pool asks `next()` whenever a job is added or one ends.
 *
 * - While fewer than `workers` jobs run, the next job comes from the organisation with the fewest jobs
 *   running (ties: the one served longest ago, then the one whose job has waited longest), never more than
 *   `perOrg` of one at once: organisations take turns, whatever their backlog.
 * - When every worker is busy, an organisation with nothing running still starts its first job at once on
 *   an extra thread, up to `maxThreads` in all: another organisation's long jobs never hold it back.
 */
export interface FairQueueLimits {
  /** Threads for jobs in turn. */
  workers: number;
  /** Threads in all, the extra ones only for organisations with nothing running. */
  maxThreads: number;
  /** Most jobs of one organisation running at once. */
  perOrg: number;
}

interface Entry<T> {
  seq: number;
  item: T;
}

export class FairQueue<T> {
  private readonly waiting = new Map<number, Entry<T>[]>();
  private readonly runningByOrg = new Map<number, number>();
  /** When each organisation last had a job started (in start order). */
  private readonly lastStart = new Map<number, number>();
  private starts = 0;
  private seq = 0;
  private running = 0;
  private size = 0;

  constructor(private readonly limits: FairQueueLimits) {}

  push(organisationId: number, item: T): void {
    const list = this.waiting.get(organisationId) ?? [];
    list.push({ seq: this.seq++, item });
    this.waiting.set(organisationId, list);
    this.size += 1;
  }

  /** Drops a waiting item (a cancelled job); false when it is not waiting (already started). */
  remove(item: T): boolean {
    for (const [org, list] of this.waiting) {
      const i = list.findIndex((e) => e.item === item);
      if (i < 0) continue;
      list.splice(i, 1);
      if (!list.length) this.waiting.delete(org);
      this.size -= 1;
      return true;
    }
    return false;
  }

  /** The job to start now (counted as running from here), or null when none may start. */
  next(): { organisationId: number; item: T } | null {
    const { workers, maxThreads, perOrg } = this.limits;
    if (this.running >= Math.max(workers, maxThreads)) return null;
    const onlyIdleOrgs = this.running >= workers;
    let best: { org: number; running: number; served: number; seq: number } | null = null;
    for (const [org, list] of this.waiting) {
      const running = this.runningOf(org);
      if (running >= perOrg || (onlyIdleOrgs && running > 0)) continue;
      const c = { org, running, served: this.lastStart.get(org) ?? -1, seq: list[0].seq };
      if (!best || before(c, best)) best = c;
    }
    if (!best) return null;
    const list = this.waiting.get(best.org)!;
    const entry = list.shift()!;
    if (!list.length) this.waiting.delete(best.org);
    this.size -= 1;
    this.running += 1;
    this.runningByOrg.set(best.org, best.running + 1);
    this.lastStart.set(best.org, this.starts++);
    return { organisationId: best.org, item: entry.item };
  }

  /** A started job of the organisation ended (any outcome). */
  done(organisationId: number): void {
    const n = this.runningOf(organisationId);
    if (n <= 1) this.runningByOrg.delete(organisationId);
    else this.runningByOrg.set(organisationId, n - 1);
    this.running = Math.max(0, this.running - 1);
  }

  runningOf(organisationId: number): number {
    return this.runningByOrg.get(organisationId) ?? 0;
  }

  stats(): { running: number; waiting: number } {
    return { running: this.running, waiting: this.size };
  }
}

/** Fewer running first, then served longer ago, then waiting longer. */
function before(a: { running: number; served: number; seq: number }, b: { running: number; served: number; seq: number }): boolean {
  if (a.running !== b.running) return a.running < b.running;
  if (a.served !== b.served) return a.served < b.served;
  return a.seq < b.seq;
}
