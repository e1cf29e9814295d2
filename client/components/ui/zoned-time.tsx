import {
  daysAgoReadsDifferently,
  deviceTimeZone,
  formatDaysAgo,
  formatInZone,
  readsDifferently,
  whoseClock,
  type Shape,
} from '../../lib/format.ts';

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

/**
 * One card's clock, named once for the whole card instead of after every line (a week review with several notes
 * repeated "(runner's clock, …)" on each). `named`: the card says whose clock its times are on, because this
 * device's clock would read at least one of them otherwise; its lines then show bare times.
 */
export type CardClock = { timeZone: string; viewerIsRunner: boolean; named: boolean };

/** A moment a card shows: the instant and how it is shown. */
export type CardMoment = { iso: string; shape: Shape };

/** The clock of a card showing `moments` of a runner in `timeZone` on this device: named when any would read otherwise. */
export function cardClock(moments: readonly CardMoment[], timeZone: string, viewerIsRunner: boolean): CardClock {
  const device = deviceTimeZone();
  return { timeZone, viewerIsRunner, named: moments.some((m) => readsDifferently(m.iso, timeZone, device, m.shape)) };
}

/** The card's one line of whose clock ("Dates and times on the runner's clock, America/Chicago."); nothing when not named. */
export function CardClockWords({ clock, className }: { clock: CardClock; className?: string }) {
  if (!clock.named) return null;
  return (
    <span data-clock="card" className={className}>
      Dates and times on the {whoseClock(clock.timeZone, clock.viewerIsRunner)}.
    </span>
  );
}

/**
 * A time on a card whose clock is named once (CardClockWords): bare, as the card says whose clock it is. A line in
 * another zone (a run started away from home, dated where it was run) names its own clock when it reads otherwise
 * than the card's clock; a line of a card left unnamed still says whose clock when this device reads it otherwise.
 */
export function CardTime({ iso, clock, shape = 'date-time' }: { iso: string; clock: CardClock; shape?: Shape }) {
  return (
    <>
      <time dateTime={iso}>{formatInZone(iso, clock.timeZone, shape)}</time>
      <LineClockWords iso={iso} timeZone={clock.timeZone} clock={clock} shape={shape} />
    </>
  );
}

/** The words after one line's time on a card, when that time would read otherwise than on the clock the reader assumes. */
export function LineClockWords({
  iso,
  timeZone,
  clock,
  shape = 'time',
}: {
  iso: string;
  timeZone: string;
  clock: CardClock;
  shape?: Shape;
}) {
  const assumed = clock.named ? clock.timeZone : deviceTimeZone();
  if (!readsDifferently(iso, timeZone, assumed, shape)) return null;
  const words = timeZone === clock.timeZone ? whoseClock(timeZone, clock.viewerIsRunner) : `${timeZone} clock`;
  return <span data-clock="runner"> ({words})</span>;
}

/**
 * How long ago something happened for a runner, in the runner's calendar days ("yesterday"); whose days they are
 * follows in words only when this device's calendar would count otherwise ("today (runner's clock, America/Chicago)").
 */
export function ZonedDaysAgo({
  iso,
  timeZone,
  viewerIsRunner,
  now,
}: Omit<Clock, 'iso' | 'shape'> & { iso: string | null; now?: number }) {
  const text = formatDaysAgo(iso, timeZone, now);
  if (!iso) return <>{text}</>;
  return (
    <>
      <time dateTime={iso}>{text}</time>
      {daysAgoReadsDifferently(iso, timeZone, deviceTimeZone(), now) && (
        <span data-clock="runner"> ({whoseClock(timeZone, viewerIsRunner)})</span>
      )}
    </>
  );
}

/** Says once, under a list of account-level dates and times, that they are read on this device's clock. */
export function DeviceClockNote({ className }: { className?: string }) {
  return (
    <p className={className ?? 'mt-2 text-xs text-ink-muted'}>Dates and times on this device’s clock ({deviceTimeZone()}).</p>
  );
}
