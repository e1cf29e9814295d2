import { useId, useState } from 'react';
import { Button } from '../../../components/ui/button.tsx';
import { Card } from '../../../components/ui/card.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { deviceTimeZone, formatOnDevice } from '../../../lib/format.ts';
import { useCalendarFeedStatus, useMakeCalendarFeed, useTurnOffCalendarFeed } from '../api/calendar-feed.ts';

// Phones get 44 px targets; the desktop keeps the usual button height.
const TAP = 'min-h-11 sm:min-h-9';

/**
 * The private calendar subscription (issue 15): turn it on, copy the address (shown once: only its
 * hash is stored), replace it when it leaked, turn it off. A coach's feed also holds the squad's sessions.
 */
export function CalendarFeedCard({ isCoach }: { isCoach: boolean }) {
  const status = useCalendarFeedStatus();
  const make = useMakeCalendarFeed();
  const turnOff = useTurnOffCalendarFeed();
  const [confirmingOff, setConfirmingOff] = useState(false);
  const busy = make.isPending || turnOff.isPending;

  return (
    <Card
      title="Calendar"
      description={
        isCoach
          ? 'Your planned sessions and those of every runner in your squads, in any calendar app that can subscribe to an address (iCalendar).'
          : 'Your planned sessions, in any calendar app that can subscribe to an address (iCalendar). Each session shows on its day with its targets and fuel plan, and follows every change.'
      }
    >
      <div className="flex flex-col gap-3">
        {status.isPending && <p className="text-ink-muted">Loading…</p>}
        {status.error && <FormAlert>{status.error.message}</FormAlert>}
        {make.data && <NewAddress key={make.data.url} url={make.data.url} onDone={make.reset} />}
        {status.data && !status.data.on && !make.data && (
          <>
            <p>The calendar feed is off.</p>
            <div>
              <Button className={TAP} disabled={busy} onClick={() => make.mutate()}>
                {make.isPending ? 'Turning on…' : 'Turn on the calendar feed'}
              </Button>
            </div>
          </>
        )}
        {status.data?.on && (
          <>
            <p>
              The calendar feed is on
              {status.data.since
                ? ` (address made ${formatOnDevice(status.data.since)}, on this device’s clock, ${deviceTimeZone()})`
                : ''}
              . Anyone who has the address can read your plan: if it was shared by mistake, or you lost it, make a new one and the
              old one stops working at once.
            </p>
            {confirmingOff ? (
              <div role="group" aria-label="Turn the calendar feed off?" className="flex flex-col gap-2">
                <p className="font-semibold">Turn it off? Calendars subscribed to it stop receiving your sessions.</p>
                <div className="flex flex-wrap gap-2">
                  <Button
                    variant="danger"
                    className={TAP}
                    disabled={busy}
                    onClick={() =>
                      turnOff.mutate(undefined, {
                        onSuccess: () => {
                          setConfirmingOff(false);
                          make.reset();
                        },
                      })
                    }
                  >
                    {turnOff.isPending ? 'Turning off…' : 'Yes, turn it off'}
                  </Button>
                  <Button variant="secondary" className={TAP} onClick={() => setConfirmingOff(false)}>
                    Keep it on
                  </Button>
                </div>
              </div>
            ) : (
              <div className="flex flex-wrap gap-2">
                <Button variant="secondary" className={TAP} disabled={busy} onClick={() => make.mutate()}>
                  {make.isPending ? 'Making a new address…' : 'Replace the address'}
                </Button>
                <Button variant="danger" className={TAP} disabled={busy} onClick={() => setConfirmingOff(true)}>
                  Turn off
                </Button>
              </div>
            )}
          </>
        )}
        {make.isError && <FormAlert>{make.error.message}</FormAlert>}
        {turnOff.isError && <FormAlert>{turnOff.error.message}</FormAlert>}
        {turnOff.isSuccess && !status.data?.on && (
          <p role="status" className="text-sm">
            The calendar feed is off; its address no longer works.
          </p>
        )}
      </div>
    </Card>
  );
}

function NewAddress({ url, onDone }: { url: string; onDone: () => void }) {
  const [copy, setCopy] = useState<'idle' | 'copied' | 'failed'>('idle');
  const fieldId = useId();
  return (
    <div role="status" className="flex flex-col gap-2 rounded-md border-l-4 border-tartan bg-tartan-wash p-3">
      <p className="font-semibold text-tartan-deep">Copy this address now: it will not be shown again.</p>
      <label htmlFor={fieldId} className="text-sm font-semibold">
        Calendar feed address
      </label>
      <input
        id={fieldId}
        readOnly
        value={url}
        onFocus={(event) => event.currentTarget.select()}
        className="w-full min-w-0 rounded border border-line bg-card px-2 py-1.5 font-mono text-sm"
      />
      <p className="text-sm">
        Paste it where your calendar app subscribes to a calendar by address. Any earlier address has stopped working.
      </p>
      <div className="flex flex-wrap gap-2">
        <Button
          variant="secondary"
          className={TAP}
          onClick={() =>
            navigator.clipboard.writeText(url).then(
              () => setCopy('copied'),
              () => setCopy('failed'),
            )
          }
        >
          {copy === 'copied' ? 'Copied' : 'Copy address'}
        </Button>
        <Button variant="quiet" className={TAP} onClick={onDone}>
          I have copied it
        </Button>
      </div>
      {copy === 'failed' && (
        <p className="text-sm">This browser did not allow copying: select the address and copy it by hand.</p>
      )}
    </div>
  );
}
