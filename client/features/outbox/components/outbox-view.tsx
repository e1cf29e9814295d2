import { useState } from 'react';
import { Card } from '../../../components/ui/card.tsx';
import { EmptyState } from '../../../components/ui/empty-state.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { isApiError } from '../../../lib/api-client.ts';
import { cn } from '../../../lib/cn.ts';
import { deviceTimeZone, formatOnDevice } from '../../../lib/format.ts';
import { useOutbox, type CaughtMessage } from '../api/get-outbox.ts';
import { MessageText } from './message-text.tsx';

/** The caught messages, newest first, and the one chosen to read (the newest until another is picked). */
export function OutboxView() {
  const outbox = useOutbox();
  const [chosenId, setChosenId] = useState<string | null>(null);

  if (outbox.isPending) {
    return (
      <p role="status" className="text-ink-muted">
        Loading the caught messages…
      </p>
    );
  }
  if (outbox.isError) {
    return isApiError(outbox.error, 404) ? (
      <EmptyState title="The outbox exists only in development.">
        <p>This server sends its e-mail through a real mail provider, so there is nothing caught to show here.</p>
      </EmptyState>
    ) : (
      <FormAlert>{outbox.error.message}</FormAlert>
    );
  }

  const messages = outbox.data;
  if (messages.length === 0) {
    return (
      <EmptyState title="No messages caught yet.">
        <p>Invite a runner from the Squad page or ask for a password reset link: the e-mail shows up here.</p>
      </EmptyState>
    );
  }
  const chosen = messages.find((m) => m.id === chosenId) ?? messages[0]!;

  return (
    <div className="grid gap-4 lg:grid-cols-[minmax(0,2fr)_minmax(0,3fr)] lg:items-start">
      <Card
        title="Caught messages"
        description={`${messages.length} ${messages.length === 1 ? 'message' : 'messages'}, newest first; times on this device’s clock (${deviceTimeZone()}).`}
        actions={
          <button
            type="button"
            onClick={() => void outbox.refetch()}
            className="inline-flex tap-target items-center text-sm font-semibold text-teal underline-offset-2 hover:underline"
          >
            {outbox.isFetching ? 'Checking…' : 'Check for new'}
          </button>
        }
      >
        <ul aria-label="Caught messages" className="-mx-2 flex flex-col">
          {messages.map((message) => (
            <li key={message.id}>
              <button
                type="button"
                aria-current={message.id === chosen.id ? 'true' : undefined}
                onClick={() => setChosenId(message.id)}
                className={cn(
                  'flex w-full flex-col rounded-md px-2 py-2 text-left hover:bg-teal-wash',
                  message.id === chosen.id && 'bg-teal-wash',
                )}
              >
                <span className="font-semibold">{message.subject}</span>
                <span className="text-sm break-all text-ink-muted">
                  to {message.to} · <time dateTime={message.sent_at}>{formatOnDevice(message.sent_at, 'date-time')}</time>
                </span>
              </button>
            </li>
          ))}
        </ul>
      </Card>
      <MessageReader key={chosen.id} message={chosen} />
    </div>
  );
}

function MessageReader({ message }: { message: CaughtMessage }) {
  const [showHtml, setShowHtml] = useState(false);
  return (
    <Card title={message.subject}>
      <article aria-label={`Message: ${message.subject}`} className="flex flex-col gap-4">
        <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-0.5 text-sm">
          <dt className="text-ink-muted">To</dt>
          <dd className="break-all">{message.to}</dd>
          <dt className="text-ink-muted">Sent</dt>
          <dd>
            <time dateTime={message.sent_at}>{formatOnDevice(message.sent_at, 'date-time')}</time>
          </dd>
        </dl>
        <MessageText text={message.text} />
        {message.html && (
          <div className="flex flex-col gap-2 border-t border-line pt-3">
            <button
              type="button"
              aria-expanded={showHtml}
              onClick={() => setShowHtml(!showHtml)}
              className="inline-flex tap-target items-center self-start text-sm font-semibold text-teal underline-offset-2 hover:underline"
            >
              {showHtml ? 'Hide the HTML version' : 'Show the HTML version'}
            </button>
            {/* sandbox="" : no scripts, no forms, no navigation; the HTML is looked at, never run. */}
            {showHtml && (
              <iframe
                title={`HTML version of ${message.subject}`}
                sandbox=""
                srcDoc={message.html}
                className="h-96 w-full rounded-md border border-line bg-white"
              />
            )}
          </div>
        )}
      </article>
    </Card>
  );
}
