import { projectRoute } from '../../../../shared/runs/route-outline.ts';
import type { RunTrack } from '../../../../shared/runs/types.ts';

const WIDTH = 320;
const HEIGHT = 240;

/** The route's shape from its own points: no map tiles, so it works offline and shows nothing of the neighbourhood. */
export function RouteOutline({ track }: { track: RunTrack }) {
  const outline = projectRoute(track.lat, track.lon, WIDTH, HEIGHT, 12);
  if (outline.lines.length === 0)
    return <p className="text-sm text-ink-muted">This run has no positions (treadmill or indoor).</p>;
  return (
    <figure className="flex flex-col gap-2">
      <svg
        viewBox={`0 0 ${WIDTH} ${HEIGHT}`}
        role="img"
        aria-label="Outline of the route, north up; a filled dot marks the start, a ring the finish"
        className="h-auto w-full max-w-sm rounded-md border border-line bg-paper"
      >
        {outline.lines.map((points, i) => (
          <polyline
            key={i}
            points={points}
            fill="none"
            stroke="var(--color-teal)"
            strokeWidth={2}
            strokeLinejoin="round"
            strokeLinecap="round"
          />
        ))}
        {outline.end && (
          <circle
            cx={outline.end.x}
            cy={outline.end.y}
            r={5}
            fill="var(--color-card)"
            stroke="var(--color-ink)"
            strokeWidth={2}
          />
        )}
        {outline.start && <circle cx={outline.start.x} cy={outline.start.y} r={4} fill="var(--color-tartan)" />}
      </svg>
      <figcaption className="text-xs text-ink-muted">
        <span aria-hidden="true" className="text-tartan">
          ●
        </span>{' '}
        start · <span aria-hidden="true">○</span> finish · north up · drawn from the recorded points, no map
      </figcaption>
    </figure>
  );
}
