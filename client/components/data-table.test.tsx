import { afterEach, describe, expect, it } from 'vitest';
import { cleanup, fireEvent, render, screen, within } from '@testing-library/react';
import type { ColumnDef } from '@tanstack/react-table';
import { DataTable } from './data-table.tsx';

// A fictional set of soil probes (behaviour test: the layout hooks and the phone sort menu).
interface Probe {
  id: string;
  name: string;
  state: string;
  last: number;
  depth: number;
  trace: string;
}
const PROBES: Probe[] = [
  { id: 'a', name: 'Beech plot probe', state: 'quiet', last: 21.5, depth: 30, trace: '▁▂▃' },
  { id: 'b', name: 'Alder plot probe', state: 'fine', last: 18.25, depth: 10, trace: '▃▂▁' },
  { id: 'c', name: 'Cedar plot probe', state: 'fine', last: 19, depth: 20, trace: '▂▂▂' },
];
const COLUMNS: ColumnDef<Probe>[] = [
  { id: 'name', header: 'Probe', accessorFn: (p) => p.name, sortingFn: 'text', meta: { phone: 'title' } },
  { id: 'depth', header: 'Depth', accessorFn: (p) => p.depth },
  { id: 'last', header: 'Last value', accessorFn: (p) => p.last, meta: { phone: 'value' } },
  { id: 'state', header: 'Status', accessorFn: (p) => p.state, enableSorting: false, meta: { phone: 'status' } },
  { id: 'trace', header: 'Trace', accessorFn: (p) => p.trace, enableSorting: false, meta: { phone: 'hidden' } },
];

const names = () =>
  screen
    .getAllByRole('row')
    .slice(1)
    .map((r) => within(r).getAllByRole('cell')[0].textContent);

afterEach(cleanup);

describe('DataTable', () => {
  it('marks every cell with its column’s phone role (detail when the column names none)', () => {
    render(<DataTable caption="Soil probes" columns={COLUMNS} data={PROBES} getRowId={(p) => p.id} empty="No probes." />);
    const row = screen.getAllByRole('row')[1];
    expect(
      within(row)
        .getAllByRole('cell')
        .map((c) => c.getAttribute('data-phone')),
    ).toEqual(['title', 'detail', 'value', 'status', 'hidden']);
  });

  it('gives value and detail cells their column label for the stacked phone layout, but not the name, status or hidden cells', () => {
    render(<DataTable caption="Soil probes" columns={COLUMNS} data={PROBES} getRowId={(p) => p.id} empty="No probes." />);
    const cells = within(screen.getAllByRole('row')[1]).getAllByRole('cell');
    expect(cells.map((c) => c.getAttribute('data-label'))).toEqual([null, 'Depth', 'Last value', null, null]);
    // drawn as generated content, so the cell's own text stays the value alone
    expect(cells.map((c) => c.textContent)).toEqual(['Beech plot probe', '30', '21.5', 'quiet', '▁▂▃']);
    expect(cells[1].className).toContain('max-sm:before:content-[attr(data-label)]');
  });

  it('offers the sortable columns in a phone sort menu that drives the same sorting as the header buttons', () => {
    render(
      <DataTable
        caption="Soil probes"
        columns={COLUMNS}
        data={PROBES}
        getRowId={(p) => p.id}
        initialSorting={[{ id: 'name', desc: false }]}
        empty="No probes."
      />,
    );
    const menu = screen.getByLabelText('Sort by') as HTMLSelectElement;
    expect([...menu.options].map((o) => o.textContent)).toEqual([
      'Probe, ascending',
      'Probe, descending',
      'Depth, ascending',
      'Depth, descending',
      'Last value, ascending',
      'Last value, descending',
    ]);
    expect(menu.value).toBe('name:asc');
    expect(names()).toEqual(['Alder plot probe', 'Beech plot probe', 'Cedar plot probe']);
    fireEvent.change(menu, { target: { value: 'depth:desc' } });
    expect(names()).toEqual(['Beech plot probe', 'Cedar plot probe', 'Alder plot probe']);
    // the header shows the same state
    expect(screen.getByRole('columnheader', { name: /Depth/ }).getAttribute('aria-sort')).toBe('descending');
    // and a header press shows in the menu
    fireEvent.click(within(screen.getByRole('columnheader', { name: /Last value/ })).getByRole('button'));
    expect(menu.value).toMatch(/^last:(asc|desc)$/);
  });

  it('shows no sort menu when the table is not sortable, and the empty message when there are no rows', () => {
    render(<DataTable caption="Soil probes" columns={COLUMNS} data={[]} getRowId={(p) => p.id} sortable={false} empty="No probes." />);
    expect(screen.queryByLabelText('Sort by')).toBeNull();
    expect(screen.getByRole('cell').textContent).toBe('No probes.');
  });
});
