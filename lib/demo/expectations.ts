import type { DemoScenario } from "./park";
import { figure, type FigureSource } from "./figures";

export interface ExpectationCheck {
  ok: boolean;
  text: string;
}

const show = (v: unknown) => (typeof v === "number" ? String(Number(v.toPrecision(4))) : String(v));

/** Checks a demo scenario's expectations against real runs of every demo scenario (by key). */
export function checkDemoExpectations(def: DemoScenario, runs: Map<string, FigureSource>): ExpectationCheck[] {
  const own = runs.get(def.key);
  if (!own) return [{ ok: false, text: `no run of ${def.key}` }];
  return def.expect.map((e) => {
    const actual = figure(own, e.field);
    let limit: unknown = e.value;
    if (e.than) {
      const other = runs.get(e.than.scenario);
      const v = other ? figure(other, e.field) : null;
      limit = typeof v === "number" ? v * e.than.factor : null;
    }
    let ok = false;
    if (e.op === "==") ok = actual === limit;
    else if (typeof actual === "number" && typeof limit === "number") {
      ok = e.op === ">=" ? actual >= limit : e.op === "<=" ? actual <= limit : e.op === ">" ? actual > limit : actual < limit;
    }
    const rel = e.than ? `${e.than.factor} × ${e.than.scenario} = ${show(limit)}` : show(limit);
    return { ok, text: `${e.field} = ${show(actual)} ${e.op} ${rel} (${e.why})` };
  });
}
