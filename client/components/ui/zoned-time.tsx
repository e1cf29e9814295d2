import { deviceTimeZone, formatInZone, readsDifferently, whoseClock, type Shape } from '../../lib/format.ts';

type Clock = {
  iso: string;
  /** The runner's zone (their profile's, or the run's own for a run's start). */
  timeZone: string;
  /** The signed-in person is the runner (their own words), else a coach or an admin reads them. */
  viewerIsRunner: boolean;
  shape?: Shape;
};

/**
 * When something happened for a runner, on the runner's clock; whose clock it is follows in words only when
 * this device's clock would read it otherwise ("07:05 (runner's clock, America/Chicago)").
 */
export function ZonedTime({ iso, timeZone, viewerIsRunner, shape = 'date-time' }: Clock) {
  return (
    <>
      <time dateTime={iso}>{formatInZone(iso, timeZone, shape)}</time>
      <ClockWords iso={iso} timeZone={timeZone} viewerIsRunner={viewerIsRunner} shape={shape} />
    </>
  );
}

/** Only the words " (runner's clock, …)", for a time already written in `timeZone`; nothing when this device reads it alike. */
export function ClockWords({ iso, timeZone, viewerIsRunner, shape = 'time' }: Clock) {
  if (!readsDifferently(iso, timeZone, deviceTimeZone(), shape)) return null;
  return <span data-clock="runner"> ({whoseClock(timeZone, viewerIsRunner)})</span>;
}

/** Says once, under a list of account-level dates and times, that they are read on this device's clock. */
export function DeviceClockNote({ className }: { className?: string }) {
  return (
    <p className={className ?? 'mt-2 text-xs text-ink-muted'}>Dates and times on this device’s clock ({deviceTimeZone()}).</p>
  );
}
