/** Our mark: a sitter's outline with the eye line a third of the way down. */
export function Logo({ size = 32 }: { size?: number }) {
  return (
    <span className="inline-flex items-center gap-2">
      <svg width={size} height={size} viewBox="0 0 64 64" aria-hidden="true" className="shrink-0">
        <rect width="64" height="64" rx="14" className="fill-spruce-600" />
        <circle cx="32" cy="30" r="15" fill="none" className="stroke-paper" strokeWidth="4" />
        <path
          d="M14 56c3-9 10-13 18-13s15 4 18 13"
          fill="none"
          className="stroke-paper"
          strokeWidth="4"
          strokeLinecap="round"
        />
        <path d="M10 25h44" className="stroke-clay-500" strokeWidth="3" strokeLinecap="round" />
      </svg>
      <span className="text-xl font-semibold tracking-tight text-spruce-700">Likeness</span>
    </span>
  );
}
