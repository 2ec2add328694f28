import type { ProgressGroup } from '../../../../server/schemas/days';

/** Booked vs invited per group as horizontal bars; the numbers are written out for everyone. */
export function ProgressChart({ title, groups }: { title: string; groups: ProgressGroup[] }) {
  if (groups.length === 0) return null;
  return (
    <figure className="flex flex-col gap-2">
      <figcaption className="font-medium">{title}</figcaption>
      <ul className="flex flex-col gap-2">
        {groups.map((group) => {
          const share = group.invited === 0 ? 0 : Math.round((group.booked / group.invited) * 100);
          return (
            <li key={group.label} className="grid grid-cols-[8rem_1fr_auto] items-center gap-3">
              <span className="truncate text-sm" title={group.label}>
                {group.label}
              </span>
              <span aria-hidden className="h-3 overflow-hidden rounded-full bg-paper-sunk">
                <span className="block h-full bg-spruce-600" style={{ width: `${share}%` }} />
              </span>
              <span className="text-sm tabular-nums">
                {group.booked} of {group.invited} booked
              </span>
            </li>
          );
        })}
      </ul>
    </figure>
  );
}
