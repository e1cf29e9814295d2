import { useState, type FormEvent } from 'react';
import { FuelItemInputSchema, type FuelItem } from '../../../../shared/fuel/schemas.ts';
import { Button } from '../../../components/ui/button.tsx';
import { Card } from '../../../components/ui/card.tsx';
import { TextField } from '../../../components/ui/field.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { isApiError } from '../../../lib/api-client.ts';
import { useCreateFuelItem } from '../api/create-fuel-item.ts';
import { useDeleteFuelItem } from '../api/delete-fuel-item.ts';
import { useFuelItems } from '../api/get-fuel-items.ts';
import { useUpdateFuelItem } from '../api/update-fuel-item.ts';
import { formatAmount, readNumber } from '../utils/fuel-format.ts';

const FIELDS = [
  { key: 'carbohydrate_g', label: 'Carbohydrate (g)' },
  { key: 'sodium_mg', label: 'Sodium (mg)' },
  { key: 'caffeine_mg', label: 'Caffeine (mg)' },
  { key: 'fluid_ml', label: 'Fluid (ml)' },
] as const;
type AmountKey = (typeof FIELDS)[number]['key'];
type ItemDraft = { name: string; serving: string } & Record<AmountKey, string>;

const EMPTY: ItemDraft = { name: '', serving: '', carbohydrate_g: '', sodium_mg: '0', caffeine_mg: '0', fluid_ml: '0' };

function draftOf(item: FuelItem): ItemDraft {
  return {
    name: item.name,
    serving: item.serving,
    carbohydrate_g: String(item.carbohydrate_g),
    sodium_mg: String(item.sodium_mg),
    caffeine_mg: String(item.caffeine_mg),
    fluid_ml: String(item.fluid_ml),
  };
}

type ItemFormProps = {
  initial: ItemDraft;
  submitLabel: string;
  formLabel: string;
  pending: boolean;
  serverError: Error | null;
  onSubmit: (input: ReturnType<typeof FuelItemInputSchema.parse>, reset: () => void) => void;
  onCancel?: () => void;
};

/** Name, serving and the amounts per serving, checked with the API's own schema before sending. */
function ItemForm({ initial, submitLabel, formLabel, pending, serverError, onSubmit, onCancel }: ItemFormProps) {
  const [draft, setDraft] = useState(initial);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const serverIssues =
    serverError && isApiError(serverError) ? Object.fromEntries(serverError.fieldIssues.map((i) => [i.field, i.message])) : {};
  const shown = { ...serverIssues, ...errors };

  function submit(event: FormEvent) {
    event.preventDefault();
    const parsed = FuelItemInputSchema.safeParse({
      name: draft.name,
      serving: draft.serving,
      carbohydrate_g: readNumber(draft.carbohydrate_g) ?? Number.NaN,
      sodium_mg: readNumber(draft.sodium_mg) ?? 0,
      caffeine_mg: readNumber(draft.caffeine_mg) ?? 0,
      fluid_ml: readNumber(draft.fluid_ml) ?? 0,
    });
    if (!parsed.success) {
      setErrors(Object.fromEntries(parsed.error.issues.map((i) => [String(i.path[0] ?? ''), i.message])));
      return;
    }
    setErrors({});
    onSubmit(parsed.data, () => setDraft(EMPTY));
  }

  return (
    <form onSubmit={submit} noValidate aria-label={formLabel} className="flex flex-col gap-3">
      <div className="grid grid-cols-1 gap-3 sm:grid-cols-2">
        <TextField
          label="Name"
          value={draft.name}
          error={shown.name}
          placeholder="energy gel"
          onChange={(e) => setDraft({ ...draft, name: e.target.value })}
        />
        <TextField
          label="Serving"
          value={draft.serving}
          error={shown.serving}
          placeholder="1 sachet"
          onChange={(e) => setDraft({ ...draft, serving: e.target.value })}
        />
      </div>
      <div className="grid grid-cols-2 gap-3 sm:grid-cols-4">
        {FIELDS.map((f) => (
          <TextField
            key={f.key}
            label={f.label}
            inputMode="decimal"
            value={draft[f.key]}
            error={shown[f.key]}
            onChange={(e) => setDraft({ ...draft, [f.key]: e.target.value })}
          />
        ))}
      </div>
      <p className="text-xs text-ink-muted">Amounts per serving, from the label. Caffeine is at most 400 mg per serving.</p>
      {serverError && Object.keys(serverIssues).length === 0 && <FormAlert>{serverError.message}</FormAlert>}
      <div className="flex flex-wrap gap-2">
        <Button type="submit" disabled={pending}>
          {submitLabel}
        </Button>
        {onCancel && (
          <Button variant="secondary" onClick={onCancel}>
            Cancel
          </Button>
        )}
      </div>
    </form>
  );
}

/** The signed-in user's fuel items: list, add, change and delete. */
export function FuelItemsCard() {
  const items = useFuelItems();
  const create = useCreateFuelItem();
  const update = useUpdateFuelItem();
  const remove = useDeleteFuelItem();
  const [editing, setEditing] = useState<string | null>(null);
  const [confirming, setConfirming] = useState<string | null>(null);
  const [status, setStatus] = useState<string | null>(null);

  return (
    <Card title="Fuel items" description="Your own list of what you take on the run: amounts per serving.">
      <div className="flex flex-col gap-4">
        {items.isError && <FormAlert>The fuel items could not be loaded: {items.error.message}</FormAlert>}
        {items.data && items.data.length === 0 && (
          <p className="text-sm text-ink-muted">
            No fuel items yet. Add the first one below, e.g. an energy gel with 25 g carbohydrate.
          </p>
        )}
        {items.data && items.data.length > 0 && (
          <ul aria-label="Your fuel items" className="flex flex-col divide-y divide-line border-y border-line">
            {items.data.map((item) => (
              <li key={item.id} className="py-2">
                {editing === item.id ? (
                  <ItemForm
                    initial={draftOf(item)}
                    formLabel={`Change ${item.name}`}
                    submitLabel="Save changes"
                    pending={update.isPending}
                    serverError={update.error}
                    onCancel={() => setEditing(null)}
                    onSubmit={(patch) =>
                      update.mutate(
                        { id: item.id, patch },
                        {
                          onSuccess: () => {
                            setEditing(null);
                            setStatus(`Saved ${patch.name}.`);
                          },
                        },
                      )
                    }
                  />
                ) : (
                  <div className="flex flex-wrap items-baseline gap-x-3 gap-y-1 text-sm">
                    <span className="font-semibold">{item.name}</span>
                    {item.serving && <span className="text-ink-muted">{item.serving}</span>}
                    <span className="tabular-nums">
                      {formatAmount(item.carbohydrate_g, { digits: 1 })} g carbohydrate · {formatAmount(item.sodium_mg)} mg sodium
                      · {formatAmount(item.caffeine_mg)} mg caffeine · {formatAmount(item.fluid_ml)} ml fluid
                    </span>
                    <span className="ml-auto flex gap-2">
                      {confirming === item.id ? (
                        <span role="group" aria-label="Confirm delete" className="flex gap-2">
                          <Button
                            variant="danger"
                            disabled={remove.isPending}
                            onClick={() =>
                              remove.mutate(item.id, {
                                onSuccess: () => {
                                  setConfirming(null);
                                  setStatus(`Deleted ${item.name}.`);
                                },
                              })
                            }
                          >
                            Yes, delete
                          </Button>
                          <Button variant="secondary" onClick={() => setConfirming(null)}>
                            Keep it
                          </Button>
                        </span>
                      ) : (
                        <>
                          <Button variant="secondary" aria-label={`Edit ${item.name}`} onClick={() => setEditing(item.id)}>
                            Edit
                          </Button>
                          <Button variant="quiet" aria-label={`Delete ${item.name}`} onClick={() => setConfirming(item.id)}>
                            Delete
                          </Button>
                        </>
                      )}
                    </span>
                  </div>
                )}
              </li>
            ))}
          </ul>
        )}
        {remove.error && <FormAlert>{remove.error.message}</FormAlert>}
        {status && <FormAlert tone="success">{status}</FormAlert>}
        <section aria-labelledby="add-fuel-item" className="flex flex-col gap-2">
          <h3 id="add-fuel-item" className="font-semibold">
            Add a fuel item
          </h3>
          <ItemForm
            initial={EMPTY}
            formLabel="Add a fuel item"
            submitLabel="Add item"
            pending={create.isPending}
            serverError={create.error}
            onSubmit={(input, reset) =>
              create.mutate(input, {
                onSuccess: (item) => {
                  reset();
                  setStatus(`Added ${item.name}.`);
                },
              })
            }
          />
        </section>
      </div>
    </Card>
  );
}
