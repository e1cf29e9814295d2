import { render, screen } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import {
  CardClockWords,
  CardTime,
  cardClock,
  DeviceClockNote,
  LineClockWords,
  ZonedDaysAgo,
  ZonedTime,
} from '../../../client/components/ui/zoned-time.tsx';

// The device's clock is what differs between a runner at home and a coach far away: the test sets it.
const device = vi.hoisted(() => ({ zone: 'America/Chicago' }));
vi.mock(import('../../../client/lib/format.ts'), async (original) => ({
  ...(await original()),
  deviceTimeZone: () => device.zone,
}));

const NOTE_AT = '2026-11-29T03:30:00.000Z'; // 28 Nov, 21:30 in Chicago; 29 Nov, 12:30 in Tokyo

describe('ZonedTime', () => {
  it('shows the runner’s clock without words on a device set to the runner’s zone', () => {
    device.zone = 'America/Chicago';
    const { container } = render(<ZonedTime iso={NOTE_AT} timeZone="America/Chicago" viewerIsRunner={false} />);
    expect(container.textContent).toBe('28 Nov 2026, 21:30');
    expect(container.querySelector('time')?.getAttribute('datetime')).toBe(NOTE_AT);
  });

  it('shows a far-away coach the runner’s clock and says so', () => {
    device.zone = 'Asia/Tokyo';
    const { container } = render(<ZonedTime iso={NOTE_AT} timeZone="America/Chicago" viewerIsRunner={false} />);
    expect(container.textContent).toBe("28 Nov 2026, 21:30 (runner's clock, America/Chicago)");
  });

  it('tells a travelling runner which clock their own note is on', () => {
    device.zone = 'Asia/Tokyo';
    const { container } = render(<ZonedTime iso={NOTE_AT} timeZone="America/Chicago" viewerIsRunner shape="date" />);
    expect(container.textContent).toBe('28 Nov 2026 (America/Chicago clock)');
  });

  it('needs no words for a date that falls on the same day on both clocks', () => {
    device.zone = 'Asia/Tokyo';
    const { container } = render(
      <ZonedTime iso="2026-11-28T12:00:00.000Z" timeZone="America/Chicago" viewerIsRunner={false} shape="date" />,
    );
    expect(container.textContent).toBe('28 Nov 2026');
  });

  it('names the device’s zone under account-level dates', () => {
    device.zone = 'Asia/Tokyo';
    render(<DeviceClockNote />);
    expect(screen.getByText('Dates and times on this device’s clock (Asia/Tokyo).')).toBeTruthy();
  });
});

describe('ZonedDaysAgo', () => {
  // 5 Dec 2026 02:00 UTC: 4 Dec in Chicago, 5 Dec in Tokyo. The upload: 4 Dec, 08:30 in Chicago; 4 Dec, 23:30 in Tokyo.
  const now = Date.UTC(2026, 11, 5, 2, 0);
  const upload = '2026-12-04T14:30:00.000Z';

  it('counts the runner’s days and names their clock when this device’s calendar counts otherwise', () => {
    device.zone = 'Asia/Tokyo';
    const { container } = render(<ZonedDaysAgo iso={upload} timeZone="America/Chicago" viewerIsRunner={false} now={now} />);
    expect(container.textContent).toBe("today (runner's clock, America/Chicago)");
    expect(container.querySelector('time')?.getAttribute('datetime')).toBe(upload);
  });

  it('needs no words when both calendars count the same', () => {
    device.zone = 'America/Chicago';
    const { container } = render(<ZonedDaysAgo iso={upload} timeZone="America/Chicago" viewerIsRunner now={now} />);
    expect(container.textContent).toBe('today');
  });

  it('says "never" without a time when nothing was uploaded', () => {
    device.zone = 'Asia/Tokyo';
    const { container } = render(<ZonedDaysAgo iso={null} timeZone="America/Chicago" viewerIsRunner={false} now={now} />);
    expect(container.textContent).toBe('never');
    expect(container.querySelector('time')).toBeNull();
  });
});

describe('a card names the runner’s clock once (CardClockWords, CardTime, LineClockWords)', () => {
  // Two notes of one evening, 21:30 and 22:10 in Chicago: 12:30 and 13:10 the next day in Tokyo.
  const NOTES = ['2026-11-29T03:30:00.000Z', '2026-11-29T04:10:00.000Z'];
  const moments = NOTES.map((iso) => ({ iso, shape: 'date-time' as const }));

  function Card({ viewerIsRunner, startedAt, runZone }: { viewerIsRunner: boolean; startedAt?: string; runZone?: string }) {
    const clock = cardClock(moments, 'America/Chicago', viewerIsRunner);
    return (
      <section>
        <h2>
          Notes <CardClockWords clock={clock} />
        </h2>
        <ol>
          {NOTES.map((iso) => (
            <li key={iso}>
              <CardTime iso={iso} clock={clock} />
            </li>
          ))}
        </ol>
        {startedAt && runZone && (
          <p data-testid="start">
            start
            <LineClockWords iso={startedAt} timeZone={runZone} clock={clock} />
          </p>
        )}
      </section>
    );
  }

  it('says whose clock once in the heading to a far-away coach; each line shows a bare time', () => {
    device.zone = 'Asia/Tokyo';
    const { container } = render(<Card viewerIsRunner={false} />);
    expect(container.querySelector('h2')?.textContent).toBe("Notes Dates and times on the runner's clock, America/Chicago.");
    expect([...container.querySelectorAll('li')].map((li) => li.textContent)).toEqual([
      '28 Nov 2026, 21:30',
      '28 Nov 2026, 22:10',
    ]);
    // Before, each line repeated the words: "28 Nov 2026, 21:30 (runner's clock, America/Chicago)".
    expect(container.textContent!.split("runner's clock").length - 1).toBe(1);
  });

  it('words it for the runner on a travelling device, and says nothing at home', () => {
    device.zone = 'Asia/Tokyo';
    const away = render(<Card viewerIsRunner />);
    expect(away.container.querySelector('h2')?.textContent).toBe('Notes Dates and times on the America/Chicago clock.');
    away.unmount();
    device.zone = 'America/Chicago';
    const home = render(<Card viewerIsRunner />);
    expect(home.container.querySelector('[data-clock]')).toBeNull();
    expect(home.container.textContent).toContain('28 Nov 2026, 21:30');
  });

  it('a run started in another zone names its own clock when it reads otherwise than the card’s', () => {
    device.zone = 'Asia/Tokyo';
    const { getByTestId } = render(<Card viewerIsRunner={false} startedAt="2026-11-28T13:05:00.000Z" runZone="Europe/Paris" />);
    expect(getByTestId('start').textContent).toBe('start (Europe/Paris clock)');
  });

  it('a line of an unnamed card still says whose clock when this device reads it otherwise', () => {
    device.zone = 'America/Chicago';
    const clock = cardClock([], 'America/Chicago', false);
    device.zone = 'Asia/Tokyo';
    const { container } = render(<CardTime iso={NOTES[0]!} clock={clock} />);
    expect(container.textContent).toBe("28 Nov 2026, 21:30 (runner's clock, America/Chicago)");
  });
});
