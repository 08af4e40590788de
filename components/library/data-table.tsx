"use client";

import {
  type ColumnDef,
  type ColumnFiltersState,
  type RowData,
  type SortingState,
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getSortedRowModel,
  useReactTable,
} from "@tanstack/react-table";
import { type ReactNode, useId, useState } from "react";
import { inputClass } from "@/components/ui/field";

// One table for the three libraries: sortable headers and a table from laptop width up, a
// stack of cards (with a sort picker) on a phone. Filtering is driven by the panel above it.

declare module "@tanstack/react-table" {
  interface ColumnMeta<TData extends RowData, TValue> {
    /** The column's name in the phone's sort picker. */
    label?: string;
    /** Extra classes for the column's cells (alignment, width). */
    cellClass?: string;
    /** Words for the two directions in the phone's sort picker, e.g. ["A–Z", "Z–A"]. */
    sortWords?: [string, string];
  }
}

export interface DataTableProps<T> {
  data: T[];
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  columns: ColumnDef<T, any>[];
  caption: string;
  getRowId: (row: T) => string;
  /** What the free-text search looks at, per row. */
  searchText: (row: T) => string;
  globalFilter: string;
  columnFilters: ColumnFiltersState;
  initialSorting: SortingState;
  renderCard: (row: T) => ReactNode;
  /** Shown when filters leave nothing. */
  noMatch: ReactNode;
}

export function DataTable<T>(props: DataTableProps<T>) {
  const { data, columns, caption, getRowId, searchText, globalFilter, columnFilters, initialSorting, renderCard, noMatch } = props;
  const [sorting, setSorting] = useState<SortingState>(initialSorting);
  const table = useReactTable({
    data,
    columns,
    getRowId,
    state: { sorting, globalFilter, columnFilters },
    onSortingChange: setSorting,
    globalFilterFn: (row, _columnId, value: string) => searchText(row.original).toLowerCase().includes(value.trim().toLowerCase()),
    getColumnCanGlobalFilter: () => true,
    getCoreRowModel: getCoreRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });
  const rows = table.getRowModel().rows;
  const sortable = table.getAllLeafColumns().filter((c) => c.getCanSort());

  return (
    <div>
      <PhoneSort
        options={sortable.map((c) => ({ id: c.id, label: c.columnDef.meta?.label ?? c.id, words: c.columnDef.meta?.sortWords ?? ["↑", "↓"] }))}
        sorting={sorting}
        onChange={setSorting}
      />
      <p className="mb-2 text-sm text-ink-faint tabular" aria-live="polite">
        {rows.length === data.length ? `${data.length} in all` : `Showing ${rows.length} of ${data.length}`}
      </p>
      {rows.length === 0 ? (
        noMatch
      ) : (
        <>
          <table className="hidden w-full border-collapse text-left lg:table">
            <caption className="sr-only">{caption}</caption>
            <thead>
              {table.getHeaderGroups().map((hg) => (
                <tr key={hg.id} className="border-b border-rule-strong">
                  {hg.headers.map((h) => {
                    const dir = h.column.getIsSorted();
                    return (
                      <th
                        key={h.id}
                        scope="col"
                        aria-sort={dir === "asc" ? "ascending" : dir === "desc" ? "descending" : undefined}
                        className={`px-2 py-2 text-sm font-medium whitespace-nowrap text-ink-soft ${h.column.columnDef.meta?.cellClass ?? ""}`}
                      >
                        {h.column.getCanSort() ? (
                          <button
                            type="button"
                            onClick={h.column.getToggleSortingHandler()}
                            className="inline-flex min-h-11 items-center gap-1 hover:text-ink"
                          >
                            {flexRender(h.column.columnDef.header, h.getContext())}
                            <span aria-hidden="true" className={dir ? "text-accent" : "text-rule-strong"}>
                              {dir === "desc" ? "▼" : dir === "asc" ? "▲" : "↕"}
                            </span>
                          </button>
                        ) : (
                          flexRender(h.column.columnDef.header, h.getContext())
                        )}
                      </th>
                    );
                  })}
                </tr>
              ))}
            </thead>
            <tbody>
              {rows.map((r) => (
                <tr key={r.id} className="border-b border-rule align-top last:border-b-0">
                  {r.getVisibleCells().map((c) => (
                    <td key={c.id} className={`px-2 py-3 ${c.column.columnDef.meta?.cellClass ?? ""}`}>
                      {flexRender(c.column.columnDef.cell, c.getContext())}
                    </td>
                  ))}
                </tr>
              ))}
            </tbody>
          </table>
          <ul className="grid gap-3 sm:grid-cols-2 lg:hidden" aria-label={caption}>
            {rows.map((r) => (
              <li key={r.id} className="rounded-lg border border-rule bg-sheet p-4">
                {renderCard(r.original)}
              </li>
            ))}
          </ul>
        </>
      )}
    </div>
  );
}

/** On a phone the headers are hidden: one picker chooses the column and the direction. */
function PhoneSort({
  options,
  sorting,
  onChange,
}: {
  options: { id: string; label: string; words: [string, string] }[];
  sorting: SortingState;
  onChange: (s: SortingState) => void;
}) {
  const id = useId();
  const current = sorting[0] ? `${sorting[0].id}:${sorting[0].desc ? "desc" : "asc"}` : "";
  return (
    <div className="mb-3 flex items-center gap-2 lg:hidden">
      <label htmlFor={id} className="text-sm text-ink-soft">
        Sort
      </label>
      <select
        id={id}
        className={`${inputClass} w-auto flex-1`}
        value={current}
        onChange={(e) => {
          const [col, dir] = e.target.value.split(":");
          onChange(col ? [{ id: col, desc: dir === "desc" }] : []);
        }}
      >
        {options.flatMap((o) => [
          <option key={`${o.id}:asc`} value={`${o.id}:asc`}>
            {o.label}: {o.words[0]}
          </option>,
          <option key={`${o.id}:desc`} value={`${o.id}:desc`}>
            {o.label}: {o.words[1]}
          </option>,
        ])}
      </select>
    </div>
  );
}
