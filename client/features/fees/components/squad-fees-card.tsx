import { useState, type FormEvent } from 'react';
import {
  CURRENCIES,
  CURRENCY_CODES,
  decimalTextToMinor,
  formatMoney,
  minorToDecimalText,
  type CurrencyCode,
} from '../../../../shared/fees/currencies.ts';
import { MAX_BLOCK_WEEKS, type Fee, type FeeInput, type FeeKind } from '../../../../shared/fees/schemas.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Card } from '../../../components/ui/card.tsx';
import { SelectField, TextField } from '../../../components/ui/field.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { DownloadLink } from '../../../components/ui/download-link.tsx';
import { billingCsvHref, useSetFee, useSetWaiver, useSquadBilling } from '../api/fees.ts';
import { describeFee, formatDay, statusWords } from './fee-words.ts';

/** The coach's "Fees" card on the Squad page: the fee, each runner's standing, totals per month, CSV. */
export function SquadFeesCard({ squadId, squadName }: { squadId: string; squadName: string }) {
  const billing = useSquadBilling(squadId);
  const waiver = useSetWaiver(squadId);
  const [editing, setEditing] = useState(false);

  return (
    <Card
      title="Fees"
      description="What runners of this squad pay you, through the payment service. Overdue never locks anyone out; what follows is your call."
    >
      {billing.isPending && <p className="text-ink-muted">Loading fees…</p>}
      {billing.error && <FormAlert>{billing.error.message}</FormAlert>}
      {billing.data && (
        <div className="flex flex-col gap-4">
          <div className="flex flex-wrap items-center gap-3">
            <p className="font-semibold" data-testid="squad-fee">
              {describeFee(billing.data.fee)}
            </p>
            {!editing && (
              <Button variant="secondary" onClick={() => setEditing(true)} aria-label={`Change the fee of ${squadName}`}>
                Change
              </Button>
            )}
          </div>
          {editing && <FeeForm squadId={squadId} fee={billing.data.fee} onDone={() => setEditing(false)} />}

          {waiver.isError && <FormAlert>{waiver.error.message}</FormAlert>}
          {billing.data.members.length === 0 ? (
            <p className="text-sm text-ink-muted">Nobody has joined yet.</p>
          ) : (
            <ul className="divide-y divide-line text-sm" aria-label={`Fees of the runners in ${squadName}`}>
              {billing.data.members.map((m) => (
                <li key={m.runner_id} className="flex flex-wrap items-center justify-between gap-2 py-2">
                  <div className="min-w-0">
                    <p className="font-semibold">{m.name}</p>
                    <p data-testid="fee-status">{statusWords(m)}</p>
                    {m.receipts.length > 0 && (
                      <p className="text-ink-muted">
                        Receipts:{' '}
                        {m.receipts
                          .map((r) => `${formatMoney(r.amount_minor, r.currency)} on ${formatDay(r.paid_at.slice(0, 10))}`)
                          .join(' · ')}
                      </p>
                    )}
                  </div>
                  <Button
                    variant="secondary"
                    disabled={waiver.isPending}
                    onClick={() => waiver.mutate({ runnerId: m.runner_id, waived: !m.waived })}
                    aria-label={m.waived ? `Charge ${m.name} again` : `Waive the fee for ${m.name}`}
                  >
                    {m.waived ? 'Charge again' : 'Waive'}
                  </Button>
                </li>
              ))}
            </ul>
          )}
          <div className="flex flex-wrap items-start justify-between gap-3">
            <div>
              <h3 className="font-semibold">Received per month</h3>
              {billing.data.totals.length === 0 ? (
                <p className="text-sm text-ink-muted">No payments yet.</p>
              ) : (
                <ul className="text-sm tabular-nums">
                  {billing.data.totals.map((t) => (
                    <li key={`${t.month}-${t.currency}`}>
                      {t.month}: {formatMoney(t.amount_minor, t.currency)} ({t.payments}{' '}
                      {t.payments === 1 ? 'payment' : 'payments'})
                    </li>
                  ))}
                </ul>
              )}
            </div>
            <DownloadLink href={billingCsvHref(squadId)}>Download fees CSV</DownloadLink>
          </div>
        </div>
      )}
    </Card>
  );
}

function FeeForm({ squadId, fee, onDone }: { squadId: string; fee: Fee; onDone: () => void }) {
  const setFee = useSetFee(squadId);
  const [kind, setKind] = useState<FeeKind>(fee.kind);
  const [currency, setCurrency] = useState<CurrencyCode>(fee.currency ?? 'USD');
  const [amount, setAmount] = useState(
    fee.amount_minor !== null && fee.currency ? minorToDecimalText(fee.amount_minor, fee.currency) : '',
  );
  const [discount, setDiscount] = useState(
    fee.first_month_discount_minor && fee.currency ? minorToDecimalText(fee.first_month_discount_minor, fee.currency) : '',
  );
  const [weeks, setWeeks] = useState(fee.block_weeks ? String(fee.block_weeks) : '12');
  const [problem, setProblem] = useState<string | null>(null);
  const decimals = CURRENCIES[currency].exponent;

  function submit(event: FormEvent) {
    event.preventDefault();
    setProblem(null);
    let input: FeeInput = { kind: 'none' };
    if (kind !== 'none') {
      const amountMinor = decimalTextToMinor(amount, currency);
      if (amountMinor === null)
        return setProblem(
          `Write the amount as a plain number with at most ${decimals} decimals, for example ${decimals ? '45.00' : '4500'}.`,
        );
      input = { kind, amount_minor: amountMinor, currency };
      if (kind === 'monthly' && discount.trim()) {
        const discountMinor = decimalTextToMinor(discount, currency);
        if (discountMinor === null) return setProblem('Write the first-month discount as a plain number, or leave it empty.');
        input.first_month_discount_minor = discountMinor;
      }
      if (kind === 'block') input.block_weeks = Number(weeks);
    }
    setFee.mutate(input, { onSuccess: onDone });
  }

  return (
    <form onSubmit={submit} className="flex flex-col gap-3 rounded-md border border-line bg-paper p-3" noValidate>
      <div className="grid gap-3 sm:grid-cols-2">
        <SelectField label="Fee" value={kind} onChange={(e) => setKind(e.target.value as FeeKind)}>
          <option value="none">No fee</option>
          <option value="monthly">Monthly</option>
          <option value="block">One-off, for a race block</option>
        </SelectField>
        {kind !== 'none' && (
          <SelectField label="Currency" value={currency} onChange={(e) => setCurrency(e.target.value as CurrencyCode)}>
            {CURRENCY_CODES.map((code) => (
              <option key={code} value={code}>
                {code}
              </option>
            ))}
          </SelectField>
        )}
        {kind !== 'none' && (
          <TextField
            label={kind === 'monthly' ? 'Amount a month' : 'Amount for the block'}
            inputMode="decimal"
            value={amount}
            onChange={(e) => setAmount(e.target.value)}
            hint={`Between ${minorToDecimalText(CURRENCIES[currency].min_minor, currency)} and ${minorToDecimalText(CURRENCIES[currency].max_minor, currency)} ${currency}.`}
          />
        )}
        {kind === 'monthly' && (
          <TextField
            label="First-month discount (optional)"
            inputMode="decimal"
            value={discount}
            onChange={(e) => setDiscount(e.target.value)}
            hint="Taken off a runner's first payment only."
          />
        )}
        {kind === 'block' && (
          <TextField
            label="Block length in weeks"
            type="number"
            min={1}
            max={MAX_BLOCK_WEEKS}
            value={weeks}
            onChange={(e) => setWeeks(e.target.value)}
          />
        )}
      </div>
      <p className="text-sm text-ink-muted">
        A change applies from each paying runner's next period; a period already paid is never charged again.
      </p>
      {problem && <FormAlert>{problem}</FormAlert>}
      {setFee.isError && <FormAlert>{setFee.error.message}</FormAlert>}
      <div className="flex flex-wrap gap-2">
        <Button type="submit" disabled={setFee.isPending}>
          {setFee.isPending ? 'Saving…' : 'Save fee'}
        </Button>
        <Button variant="quiet" onClick={onDone}>
          Keep as it is
        </Button>
      </div>
    </form>
  );
}
