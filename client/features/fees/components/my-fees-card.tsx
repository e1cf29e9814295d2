import { formatMoney } from '../../../../shared/fees/currencies.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Card } from '../../../components/ui/card.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { useCancelFee, useMyFees, useOpenPortal, useStartCheckout } from '../api/fees.ts';
import { describeFee, formatDay, statusWords } from './fee-words.ts';

/** A runner's fees: what each squad charges, where they stand, pay, cancel, change the card, receipts. */
export function MyFeesCard() {
  const fees = useMyFees();
  const checkout = useStartCheckout();
  const cancel = useCancelFee();
  const portal = useOpenPortal();
  return (
    <Card
      title="Squad fees"
      description="Cards are typed on the payment service's own page; Pacewright never sees the number. Whatever you owe, your data stays yours."
    >
      {fees.isPending && <p className="text-ink-muted">Loading your fees…</p>}
      {fees.error && <FormAlert>{fees.error.message}</FormAlert>}
      {[checkout, cancel, portal].map((m, i) => m.isError && <FormAlert key={i}>{m.error.message}</FormAlert>)}
      {fees.data?.length === 0 && <p className="text-ink-muted">None of your squads charges a fee.</p>}
      <ul className="divide-y divide-line">
        {fees.data?.map((f) => {
          const canPay = ['due', 'overdue'].includes(f.status) || (f.status === 'cancelled' && !f.has_subscription);
          return (
            <li key={f.squad.id} className="flex flex-col gap-2 py-3">
              <div className="flex flex-wrap items-baseline justify-between gap-2">
                <p className="font-semibold">{f.squad.name}</p>
                <p className="text-sm">{describeFee(f.fee)}</p>
              </div>
              <p data-testid="my-fee-status">{statusWords(f)}</p>
              <div className="flex flex-wrap gap-2">
                {canPay && (
                  <Button disabled={checkout.isPending} onClick={() => checkout.mutate(f.squad.id)}>
                    {checkout.isPending ? 'Opening the payment page…' : 'Pay'}
                  </Button>
                )}
                {f.has_subscription && !f.cancel_at_period_end && (
                  <Button variant="secondary" disabled={cancel.isPending} onClick={() => cancel.mutate(f.squad.id)}>
                    Cancel at period end
                  </Button>
                )}
                {f.has_subscription && (
                  <Button variant="quiet" disabled={portal.isPending} onClick={() => portal.mutate()}>
                    Change card
                  </Button>
                )}
              </div>
              {f.receipts.length > 0 && (
                <div>
                  <h3 className="text-sm font-semibold">Receipts</h3>
                  <ul className="text-sm tabular-nums" aria-label={`Receipts for ${f.squad.name}`}>
                    {f.receipts.map((r) => (
                      <li key={r.id}>
                        {formatMoney(r.amount_minor, r.currency)} paid {formatDay(r.paid_at.slice(0, 10))} · covers{' '}
                        {formatDay(r.period_start)} – {formatDay(r.period_end)}
                      </li>
                    ))}
                  </ul>
                </div>
              )}
            </li>
          );
        })}
      </ul>
    </Card>
  );
}
