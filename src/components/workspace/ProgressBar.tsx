/** A labelled progress bar (0–100) that screen readers announce. */
export default function ProgressBar({ label, percent }: { label: string; percent: number }) {
  const value = Math.max(0, Math.min(100, Math.round(percent)));
  return (
    <div className="flex flex-col gap-1" data-testid="terrain-progress">
      <div className="flex justify-between text-sm text-bark-700">
        <span>{label}</span>
        <span className="tabular-nums">{value}%</span>
      </div>
      <div
        role="progressbar"
        aria-label={label}
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={value}
        className="h-3 overflow-hidden rounded-full bg-sand-200"
      >
        <div className="h-full rounded-full bg-creek-500 transition-[width] duration-300" style={{ width: `${value}%` }} />
      </div>
    </div>
  );
}
