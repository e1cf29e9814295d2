import { render, screen } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { DeviceClockNote, ZonedTime } from '../../../client/components/ui/zoned-time.tsx';

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
