export function ProgressBar({ value, label }: { value: number; label: string }) {
  const pct = Math.round(Math.max(0, Math.min(1, value)) * 100);
  return (
    <div className="flex min-w-48 flex-1 items-center gap-2" data-testid="run-progress" data-progress={pct}>
      <div className="h-2 flex-1 overflow-hidden rounded-full bg-steel-100" role="progressbar" aria-valuemin={0} aria-valuemax={100} aria-valuenow={pct} aria-label={label}>
        <div className="h-full rounded-full bg-lamp-500 transition-[width] duration-150" style={{ width: `${pct}%` }} />
      </div>
      <span className="w-10 text-right font-mono text-[12px] tabular-nums text-ink-800">{pct} %</span>
    </div>
  );
}
