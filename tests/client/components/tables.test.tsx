import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import { ResponsiveTable, type TableColumn } from '../../../client/components/ui/responsive-table.tsx';
import { LapsTable } from '../../../client/features/runs/components/laps-table.tsx';

// The phone pattern both tables share: only primary columns on a phone, the others opened under a
// row by its "All figures" button as label–value lines (client/components/ui/table-row-details.tsx).

type Intake = { at: string; what: string; carbohydrate: number; sodium: number };
const COLUMNS: TableColumn<Intake>[] = [
  { id: 'at', header: 'At', primary: true, rowHeader: true, cell: (r) => r.at },
  { id: 'what', header: 'What', primary: true, cell: (r) => r.what },
  { id: 'carb', header: 'Carbohydrate (g)', align: 'right', cell: (r) => r.carbohydrate },
  { id: 'sodium', header: <abbr title="sodium">Na</abbr>, label: 'Sodium (mg)', align: 'right', cell: (r) => r.sodium },
];
const ROWS: Intake[] = [
  { at: '0:40', what: 'gel', carbohydrate: 22, sodium: 40 },
  { at: '1:20', what: 'chews', carbohydrate: 24, sodium: 50 },
];

describe('ResponsiveTable', () => {
  it('marks primary cells, and a row\'s "All figures" button opens and closes its other columns as label–value lines', async () => {
    const user = userEvent.setup();
    render(
      <ResponsiveTable
        caption="Intakes"
        columns={COLUMNS}
        rows={ROWS}
        rowKey={(r) => r.at}
        rowLabel={(r) => `intake at ${r.at}`}
      />,
    );
    const table = screen.getByRole('table', { name: 'Intakes' });
    expect(table.querySelectorAll('[data-primary]')).toHaveLength(4);

    const second = screen.getByRole('button', { name: 'All figures: intake at 1:20' });
    expect(second.getAttribute('aria-expanded')).toBe('false');
    expect(table.querySelectorAll('dl')).toHaveLength(0);

    await user.click(second);
    expect(second.getAttribute('aria-expanded')).toBe('true');
    const details = document.getElementById(second.getAttribute('aria-controls')!)!;
    const terms = within(details)
      .getAllByRole('term')
      .map((t) => t.textContent);
    const values = within(details)
      .getAllByRole('definition')
      .map((d) => d.textContent);
    expect(terms).toEqual(['Carbohydrate (g)', 'Sodium (mg)']);
    expect(values).toEqual(['24', '50']);
    // Only the row asked for opens.
    expect(screen.getByRole('button', { name: 'All figures: intake at 0:40' }).getAttribute('aria-expanded')).toBe('false');

    await user.click(second);
    expect(second.getAttribute('aria-expanded')).toBe('false');
    expect(table.querySelectorAll('dl')).toHaveLength(0);
  });

  it('shows no "more" column when no column is primary', () => {
    render(
      <ResponsiveTable
        caption="Plain"
        columns={COLUMNS.map((c) => ({ ...c, primary: false }))}
        rows={ROWS}
        rowKey={(r) => r.at}
      />,
    );
    expect(screen.queryAllByRole('button')).toHaveLength(0);
    expect(screen.getByRole('table').querySelectorAll('[data-primary]')).toHaveLength(0);
  });
});

describe('DataTable (device laps)', () => {
  it("sorts by a header button and opens a lap's heart-rate columns under it", async () => {
    const user = userEvent.setup();
    const lap = (index: number, distance_m: number, total_time_s: number, avg_hr: number) => ({
      index,
      started_at: '2026-11-24T07:00:00Z',
      distance_m,
      total_time_s,
      avg_hr,
      max_hr: avg_hr + 10,
    });
    render(<LapsTable unit="km" laps={[lap(1, 1000, 300, 150), lap(2, 1000, 280, 160), lap(3, 1000, 310, 155)]} />);
    const rowHeaders = () => screen.getAllByRole('rowheader').map((h) => h.textContent);
    expect(rowHeaders()).toEqual(['1', '2', '3']);

    await user.click(screen.getByRole('button', { name: /^Time/ }));
    expect(screen.getByRole('columnheader', { name: /^Time/ }).getAttribute('aria-sort')).toBe('ascending');
    expect(rowHeaders()).toEqual(['2', '1', '3']);

    const more = screen.getByRole('button', { name: 'All figures: lap 2' });
    await user.click(more);
    const details = document.getElementById(more.getAttribute('aria-controls')!)!;
    expect(
      within(details)
        .getAllByRole('term')
        .map((t) => t.textContent),
    ).toEqual(['Avg HR', 'Max HR']);
    expect(
      within(details)
        .getAllByRole('definition')
        .map((d) => d.textContent),
    ).toEqual(['160', '170']);
  });
});
