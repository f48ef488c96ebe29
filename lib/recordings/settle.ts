/**
 * "Why the train settled back" for a recorded dispatch: the workspace's account (lib/runs/settle-back.ts)
 * fed from the recorded train speed. A logger does not measure the ARD force, so the catch is taken where
 * the train, after rolling back, stands still (speed within ±0.02 m/s) until the dog takes it to 95 % of
 * chain speed; the rollback is the backward distance integrated from the speed. Pure.
 */
import { settleBackAccount, type SettleBackAccount, type SettleBackInput } from "@/lib/runs/settle-back";
import type { UnitSystem } from "@/lib/client/units";

export interface RecordedDispatch {
  t: number[];
  trainSpeed: (number | null)[];
  trainPosition: (number | null)[];
  engagementTime: number | null;
}

export function recordedSettleBack(rec: RecordedDispatch, design: Omit<SettleBackInput, "summary" | "series">, units: UnitSystem = "si"): SettleBackAccount | null {
  const idx = rec.t.map((_, i) => i).filter((i) => rec.trainSpeed[i] !== null);
  if (idx.length < 3) return null;
  const t = idx.map((i) => rec.t[i]);
  const v = idx.map((i) => rec.trainSpeed[i]!);
  const V = design.drive.speed;
  // Position: recorded if there is one, else integrated from the speed from the scenario's start position.
  const x: number[] = [];
  idx.forEach((i, k) => {
    const p = rec.trainPosition[i];
    x.push(p !== null ? p : k === 0 ? 0 : x[k - 1] + ((v[k] + v[k - 1]) / 2) * (t[k] - t[k - 1]));
  });
  let rollback = 0;
  let rolledBack = false;
  let picked = false;
  const ard = v.map((vk, k) => {
    if (k > 0 && vk < 0) rollback += (-(vk + Math.min(0, v[k - 1])) / 2) * (t[k] - t[k - 1]);
    if (vk < -0.02) rolledBack = true;
    if (rolledBack && vk >= 0.95 * V) picked = true;
    return rolledBack && !picked && Math.abs(vk) <= 0.02 ? 1 : 0;
  });
  const catches = ard.some((a) => a > 0) ? 1 : 0;
  const pickupIdx = v.findIndex((vk, k) => rolledBack && k > ard.indexOf(1) && ard.indexOf(1) >= 0 && vk >= 0.95 * V);
  const eng = rec.engagementTime;
  const account = settleBackAccount({
    ...design,
    train: { ...design.train, entrySpeed: v[0] },
    summary: {
      ardCatches: catches,
      rollbackDistance: rollback,
      engagementTime: eng,
      pickupDelay: eng !== null && pickupIdx >= 0 ? t[pickupIdx] - eng : null,
      peakArdForce: 0,
    },
    series: { t, ardForce: ard, trainPosition: x, trainSpeed: v },
  }, units);
  if (!account) return null;
  // The logger has no ARD force: drop that figure from the account's sentence.
  return { ...account, sentences: account.sentences.map((s) => s.replace(/ \(peak ARD force [^)]*\)/, " (the logger does not record the ARD force)")) };
}
