import type { TargetStatus } from '../../../../shared/fuel/schedule.ts';
import { STATUS_GLYPHS } from '../../../../shared/fuel/schedule.ts';
import { usFlOzToMl } from '../../../../shared/fuel/targets.ts';
import type { FuelItem } from '../../../../shared/fuel/schemas.ts';

/** Status word with its glyph: "✓ within", "▽ under", "△ over" (never colour alone). */
export function statusText(status: TargetStatus): string {
  return `${STATUS_GLYPHS[status]} ${status}`;
}

/** A number for a table cell: whole numbers plain, others to `digits`; zero as "—" when `dashZero`. */
export function formatAmount(value: number, { digits = 0, dashZero = false } = {}): string {
  if (dashZero && Math.abs(value) < 1e-9) return '—';
  const f = 10 ** digits;
  const rounded = Math.round(value * f) / f;
  return rounded.toLocaleString('en-GB', { maximumFractionDigits: digits });
}

/** Seconds from the start as `h:mm` (0:40, 1:20). */
export function formatTimeFromStart(seconds: number): string {
  const m = Math.round(seconds / 60);
  return `${Math.floor(m / 60)}:${String(m % 60).padStart(2, '0')}`;
}

/**
 * Reads a time from the start: `h:mm` or `h:mm:ss` ("1:20" is 1 h 20 min); a bare number is minutes.
 * Returns null for anything else.
 */
export function parseRunTime(text: string): number | null {
  const t = text.trim();
  if (/^\d+(\.\d+)?$/.test(t)) return Number(t) * 60;
  const m = /^(\d+):([0-5]\d)(?::([0-5]\d))?$/.exec(t);
  if (!m) return null;
  return Number(m[1]) * 3600 + Number(m[2]) * 60 + Number(m[3] ?? 0);
}

/** Reads a pace `m:ss` as seconds; null for anything else. */
export function parsePace(text: string): number | null {
  const m = /^(\d{1,2}):([0-5]\d)$/.exec(text.trim());
  return m ? Number(m[1]) * 60 + Number(m[2]) : null;
}

/** Reads an optional number: '' is undefined, anything unreadable NaN (so the schema names the field). */
export function readNumber(text: string): number | undefined {
  const t = text.trim();
  return t === '' ? undefined : Number(t);
}

/** A list of numbers or times separated by commas or spaces. */
export function splitList(text: string): string[] {
  return text
    .split(/[,;\s]+/)
    .map((s) => s.trim())
    .filter(Boolean);
}

export type VolumeUnit = 'ml' | 'fl oz';

/** Millilitres of a volume in ml or US fl oz (NIST: 29.5735295625 ml each). */
export function toMl(value: number, unit: VolumeUnit): number {
  return unit === 'ml' ? value : usFlOzToMl(value);
}

export interface BottleMix {
  carbohydrate_g: number;
  sodium_mg: number;
  caffeine_mg: number;
  /** g per 100 ml. */
  carbohydrate_pct: number;
  sodium_mg_per_l: number;
}

/** What a bottle of `volumeMl` carries with `contents` mixed in, and its concentration (item fluid ignored: the volume is the liquid). */
export function bottleMix(
  volumeMl: number,
  contents: ReadonlyArray<{ item_id: string; servings: number }>,
  items: readonly FuelItem[],
): BottleMix | null {
  if (!(volumeMl > 0)) return null;
  let carbs = 0;
  let sodium = 0;
  let caffeine = 0;
  for (const c of contents) {
    const item = items.find((i) => i.id === c.item_id);
    if (!item || !(c.servings > 0)) continue;
    carbs += item.carbohydrate_g * c.servings;
    sodium += item.sodium_mg * c.servings;
    caffeine += item.caffeine_mg * c.servings;
  }
  const litres = volumeMl / 1000;
  return {
    carbohydrate_g: carbs,
    sodium_mg: sodium,
    caffeine_mg: caffeine,
    carbohydrate_pct: carbs / litres / 10,
    sodium_mg_per_l: sodium / litres,
  };
}
