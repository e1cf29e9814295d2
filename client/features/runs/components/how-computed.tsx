import { describeCleaning } from '../../../../shared/runs/display.ts';
import type { RunDetail } from '../../../../shared/runs/types.ts';

const DISTANCE_SOURCE = {
  device: 'the device’s own record of distance (TCX DistanceMeters), as the watch measured it',
  geodesic:
    'the sum of distances between consecutive points on the WGS-84 ellipsoid (GeographicLib, Karney 2013); GPS jitter while stopped is not counted. On noisy 1–2 s files the positions are first smoothed (a constant-velocity Kalman filter with the Rauch–Tung–Striebel smoother, 1965), as strongly as the file’s own measured jitter calls for, because jitter makes a path drawn through the points read long; chords through bends are lengthened to the arc they cut',
  none: 'nothing: the file has neither positions nor a device distance',
} as const;

// Figures in the text follow shared/tracks (MOVING_SPEED_MPS, MOVING_WINDOW_S, ELEVATION_SMOOTHING_HALF_WINDOW_S,
// ELEVATION_HYSTERESIS_M); not imported, so the page does not pull the geodesy library into the client.

/** How each number on the page is made, with its source, and what cleaning changed in the file. */
export function HowComputed({ run }: { run: RunDetail }) {
  const { summary, details } = run;
  const cleaning = describeCleaning(details.cleaning);
  return (
    <div className="flex flex-col gap-3 text-sm">
      <ul className="list-disc space-y-1.5 pl-5 text-ink-muted marker:text-line-strong">
        <li>
          <strong className="text-ink">Distance</strong> comes from {DISTANCE_SOURCE[summary.distance_source]}.
        </li>
        <li>
          <strong className="text-ink">Split boundaries</strong> fall at exactly k × 1609.344 m (international mile) or k × 1000
          m; the time at each boundary is interpolated linearly between the two points around it. The last split may be partial
          and shows its real distance.
        </li>
        <li>
          <strong className="text-ink">Moving time</strong> leaves out stops (less than 0.3 m/s, about 1 km/h, of headway over a
          10-second window) and pauses in the recording. Clock time includes them. Pace is moving time over distance.
        </li>
        <li>
          <strong className="text-ink">Flat-equivalent pace</strong> is the pace that would cost the same energy on level ground,
          from the energy cost of running on slopes measured by Minetti et al. (2002, Journal of Applied Physiology 93:1039–1046).
        </li>
        <li>
          <strong className="text-ink">Climb and descent</strong> use elevation smoothed over ±10 s and counted only once it has
          moved 3 m from the last turning point, so GPS noise on a flat loop does not add up to hundreds of metres.
        </li>
        <li>
          <strong className="text-ink">Date and time</strong> are local to {summary.time_zone}, taken from{' '}
          {summary.time_zone_source === 'start position'
            ? 'the position where the run started'
            : 'your profile (the file had no usable start position)'}
          .
        </li>
        <li>
          <strong className="text-ink">The file</strong> ({details.format.toUpperCase()}) held {details.cleaning.input_points}{' '}
          points; {summary.points} were used{summary.segments > 1 ? `, in ${summary.segments} recorded segments` : ''}.
        </li>
      </ul>
      {cleaning.length > 0 && (
        <div className="rounded-md border-l-4 border-line-strong bg-paper px-3 py-2">
          <p className="font-semibold">What was cleaned</p>
          <ul className="mt-1 space-y-0.5 text-ink-muted">
            {cleaning.map((line) => (
              <li key={line}>{line}</li>
            ))}
          </ul>
        </div>
      )}
    </div>
  );
}
