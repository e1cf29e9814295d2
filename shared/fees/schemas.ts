import { z } from 'zod';
import { CURRENCIES, CURRENCY_CODES, minorToDecimalText, type CurrencyCode } from './currencies.ts';

/**
 * Coach fees (issue 20). `none` is the default; `monthly` is a subscription; `block` is a one-off fee for a race
 * block of N weeks (our extension of api-contract.md's `none | monthly`). Amounts are integer minor units with the
 * currency beside them, always.
 */
export const FeeKindSchema = z.enum(['none', 'monthly', 'block']);
export type FeeKind = z.infer<typeof FeeKindSchema>;

/** Longest race block a one-off fee may cover (our choice: a marathon build is 12–20 weeks). */
export const MAX_BLOCK_WEEKS = 52;

const amountIssue = (currency: CurrencyCode) => {
  const { min_minor, max_minor } = CURRENCIES[currency];
  return `The fee must be between ${minorToDecimalText(min_minor, currency)} and ${minorToDecimalText(max_minor, currency)} ${currency}.`;
};

export const FeeInputSchema = z
  .object({
    kind: FeeKindSchema,
    amount_minor: z
      .number({ error: 'Give the fee as a whole number of the currency’s smallest unit (cents).' })
      .int('Give the fee as a whole number of the currency’s smallest unit (cents).')
      .optional(),
    currency: z.enum(CURRENCY_CODES, { error: `Pick one of these currencies: ${CURRENCY_CODES.join(', ')}.` }).optional(),
    /** Taken off the first month only (monthly fees). */
    first_month_discount_minor: z
      .number({ error: 'Give the discount as a whole number of cents.' })
      .int('Give the discount as a whole number of cents.')
      .optional(),
    /** How many weeks a one-off block fee covers. */
    block_weeks: z.number({ error: 'Give the block length in weeks.' }).int('Give the block length in whole weeks.').optional(),
  })
  .strict()
  .superRefine((fee, ctx) => {
    if (fee.kind === 'none') {
      for (const field of ['amount_minor', 'currency', 'first_month_discount_minor', 'block_weeks'] as const)
        if (fee[field] !== undefined)
          ctx.addIssue({ code: 'custom', path: [field], message: 'A squad without a fee takes no amount.' });
      return;
    }
    if (fee.currency === undefined) {
      ctx.addIssue({ code: 'custom', path: ['currency'], message: 'Pick the currency of the fee.' });
      return;
    }
    const { min_minor, max_minor } = CURRENCIES[fee.currency];
    if (fee.amount_minor === undefined)
      ctx.addIssue({ code: 'custom', path: ['amount_minor'], message: 'Give the amount of the fee.' });
    else if (fee.amount_minor < min_minor || fee.amount_minor > max_minor)
      ctx.addIssue({ code: 'custom', path: ['amount_minor'], message: amountIssue(fee.currency) });
    if (fee.first_month_discount_minor !== undefined) {
      if (fee.kind !== 'monthly')
        ctx.addIssue({
          code: 'custom',
          path: ['first_month_discount_minor'],
          message: 'Only a monthly fee has a first-month discount.',
        });
      else if (
        fee.amount_minor !== undefined &&
        (fee.first_month_discount_minor < 1 || fee.first_month_discount_minor > fee.amount_minor - min_minor)
      )
        ctx.addIssue({
          code: 'custom',
          path: ['first_month_discount_minor'],
          message: `The discount must leave at least ${minorToDecimalText(min_minor, fee.currency)} ${fee.currency} to pay in the first month.`,
        });
    }
    if (fee.kind === 'block') {
      if (fee.block_weeks === undefined || fee.block_weeks < 1 || fee.block_weeks > MAX_BLOCK_WEEKS)
        ctx.addIssue({ code: 'custom', path: ['block_weeks'], message: `A block lasts 1 to ${MAX_BLOCK_WEEKS} weeks.` });
    } else if (fee.block_weeks !== undefined)
      ctx.addIssue({ code: 'custom', path: ['block_weeks'], message: 'Only a one-off block fee has a length in weeks.' });
  });
export type FeeInput = z.infer<typeof FeeInputSchema>;

export const FeeSchema = z.object({
  kind: FeeKindSchema,
  amount_minor: z.number().int().nullable(),
  currency: z.enum(CURRENCY_CODES).nullable(),
  first_month_discount_minor: z.number().int().nullable(),
  block_weeks: z.number().int().nullable(),
});
export type Fee = z.infer<typeof FeeSchema>;

export const NO_FEE: Fee = {
  kind: 'none',
  amount_minor: null,
  currency: null,
  first_month_discount_minor: null,
  block_weeks: null,
};

export const FeeAnswerSchema = z.object({ fee: FeeSchema });
export type FeeAnswer = z.infer<typeof FeeAnswerSchema>;

export const BillingStatusSchema = z.enum(['free', 'due', 'paid', 'overdue', 'cancelled', 'waived']);
export type BillingStatus = z.infer<typeof BillingStatusSchema>;

export const ReceiptSchema = z.object({
  id: z.string(),
  amount_minor: z.number().int(),
  currency: z.string(),
  paid_at: z.string(),
  /** The calendar dates the payment covers (UTC). */
  period_start: z.string(),
  period_end: z.string(),
});
export type Receipt = z.infer<typeof ReceiptSchema>;

export const BillingMemberSchema = z.object({
  runner_id: z.string(),
  name: z.string(),
  status: BillingStatusSchema,
  /** Last day paid for (YYYY-MM-DD), or null when nothing was paid yet. */
  paid_through: z.string().nullable(),
  /** Whole days since `paid_through` when overdue, else 0. */
  overdue_days: z.number().int(),
  /** The runner has cancelled; the paid period still runs to `paid_through`. */
  cancel_at_period_end: z.boolean(),
  waived: z.boolean(),
  receipts: z.array(ReceiptSchema),
});
export type BillingMember = z.infer<typeof BillingMemberSchema>;

export const MonthTotalSchema = z.object({
  month: z.string(),
  currency: z.string(),
  amount_minor: z.number().int(),
  payments: z.number().int(),
});

export const BillingAnswerSchema = z.object({
  fee: FeeSchema,
  members: z.array(BillingMemberSchema),
  /** Money received per calendar month (UTC) and currency, newest first. */
  totals: z.array(MonthTotalSchema),
});
export type BillingAnswer = z.infer<typeof BillingAnswerSchema>;

export const WaiverInputSchema = z
  .object({ waived: z.boolean({ error: 'Say whether the fee is waived (true or false).' }) })
  .strict();

export const UrlAnswerSchema = z.object({ url: z.string() });

/** A runner's own fees, one entry per squad they belong to that charges one. */
export const MyFeeSchema = z.object({
  squad: z.object({ id: z.string(), name: z.string() }),
  fee: FeeSchema,
  status: BillingStatusSchema,
  paid_through: z.string().nullable(),
  overdue_days: z.number().int(),
  cancel_at_period_end: z.boolean(),
  /** A subscription exists, so the hosted portal has something to show. */
  has_subscription: z.boolean(),
  receipts: z.array(ReceiptSchema),
});
export type MyFee = z.infer<typeof MyFeeSchema>;
export const MyFeesAnswerSchema = z.object({ fees: z.array(MyFeeSchema) });

export const TEST_CARDS = { pays: '4242424242424242', declined: '4000000000000002' } as const;

export const DevCompleteInputSchema = z
  .object({
    url: z.string({ error: 'Give the checkout page address.' }).max(500, 'This is not a checkout page address.'),
    card: z
      .string({ error: 'Give a test card number.' })
      .regex(/^\d{12,19}$/, 'Give a test card number of 12 to 19 digits, without spaces.'),
  })
  .strict();

export const DevCompleteAnswerSchema = z.object({ outcome: z.enum(['paid', 'declined']), message: z.string() });

/** `PUT /api/squads/:id/members/:runnerId/fee-waiver`: whether the runner's fee is waived now. */
export const FeeWaiverAnswerSchema = z.object({ waived: z.boolean() });
export type FeeWaiverAnswer = z.infer<typeof FeeWaiverAnswerSchema>;
