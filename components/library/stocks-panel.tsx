"use client";

import type { ColumnDef } from "@tanstack/react-table";
import { useMemo, useState } from "react";
import { formatAmount } from "@/colour/units";
import { useAccount } from "@/components/account/use-account";
import { useCan, useStudio } from "@/components/studio/studio-context";
import { Button } from "@/components/ui/button";
import { EmptyState, Notice } from "@/components/ui/sheet";
import { STOCK_DEFINITION_LABELS } from "@/lib/schemas/library";
import { StockAge, Swatch } from "./chips";
import { DataTable } from "./data-table";
import { FormDialog } from "./form-dialog";
import { SdsLink } from "./sds-link";
import { ShelfLife } from "./shelf-life";
import { StockForm } from "./stock-form";
import { FilterSelect, SearchBox, Toolbar, toColumnFilters } from "./toolbar";
import { useDyes } from "./use-dyes";
import { type StockDto, useStocks } from "./use-stocks";

// The Stock solutions tab: jars on the shelf, newest first, with an age warning past the shelf life.

const strength = (s: StockDto) => `${s.concentrationPct} % ${STOCK_DEFINITION_LABELS[s.definition]}`;
const day = (iso: string) => new Date(`${iso}T00:00:00`).toLocaleDateString(undefined, { day: "numeric", month: "short", year: "numeric" });

export function StocksPanel() {
  const { studioId } = useStudio();
  const canEdit = useCan("library.edit");
  const canArchive = useCan("library.delete");
  const isOwner = useCan("studio.update");
  const stocks = useStocks(studioId);
  const dyes = useDyes(studioId);
  const account = useAccount();
  const units = account.data?.unitSystem ?? "metric";
  const [q, setQ] = useState("");
  const [filters, setFilters] = useState({ dye: "", age: "", definition: "" });
  const [editing, setEditing] = useState<string | "new" | null>(null);
  const current = editing && editing !== "new" ? stocks.data?.find((s) => s.id === editing) : undefined;

  const columns = useMemo<ColumnDef<StockDto>[]>(
    () => [
      {
        id: "dye",
        accessorFn: (s) => s.dye.name,
        header: "Dye",
        sortingFn: "text",
        filterFn: (row, _id, v: string) => row.original.dye.id === v,
        meta: { label: "Dye", sortWords: ["A–Z", "Z–A"] },
        cell: ({ row }) => (
          <div className="flex min-w-40 items-start gap-2">
            <Swatch hex={row.original.dye.displayHex} />
            <div>
              <p className="font-medium">{row.original.dye.name}</p>
              {row.original.notes && <p className="line-clamp-2 text-sm text-ink-soft">{row.original.notes}</p>}
            </div>
          </div>
        ),
      },
      {
        id: "concentration",
        accessorKey: "concentrationPct",
        header: "Strength",
        filterFn: (row, _id, v: string) => row.original.definition === v,
        meta: { label: "Strength", sortWords: ["weakest first", "strongest first"] },
        cell: ({ row }) => <span className="tabular">{strength(row.original)}</span>,
      },
      {
        id: "volume",
        accessorKey: "volumeMl",
        header: "Volume",
        meta: { label: "Volume", cellClass: "tabular", sortWords: ["least first", "most first"] },
        cell: ({ row }) => formatAmount(row.original.volumeMl, units),
      },
      {
        id: "mixedOn",
        accessorKey: "mixedOn",
        header: "Mixed",
        meta: { label: "Mixed", sortWords: ["oldest first", "newest first"] },
        filterFn: (row, _id, v: string) => String(row.original.pastShelfLife) === v,
        cell: ({ row }) => (
          <div className="space-y-1">
            <p className="tabular">{day(row.original.mixedOn)}</p>
            <StockAge {...row.original} />
          </div>
        ),
      },
      { id: "lot", accessorKey: "powderLot", header: "Powder lot", enableSorting: false, cell: ({ row }) => <span className="font-mono text-sm">{row.original.powderLot || "—"}</span> },
      { id: "sds", header: "Safety", enableSorting: false, cell: ({ row }) => <SdsLink url={row.original.dye.sdsUrl} name={row.original.dye.name} /> },
      ...(canEdit
        ? [
            {
              id: "edit",
              header: () => <span className="sr-only">Edit</span>,
              enableSorting: false,
              cell: ({ row }) => (
                <Button variant="quiet" onClick={() => setEditing(row.original.id)} aria-label={`Edit the ${row.original.dye.name} stock`}>
                  Edit
                </Button>
              ),
            } satisfies ColumnDef<StockDto>,
          ]
        : []),
    ],
    [canEdit, units],
  );

  // The age filter rides on the "mixedOn" column, how it was made on "concentration".
  const columnFilters = toColumnFilters({ dye: filters.dye, mixedOn: filters.age, concentration: filters.definition });
  const old = stocks.data?.filter((s) => s.pastShelfLife).length ?? 0;

  return (
    <div>
      <div className="mb-3 flex flex-wrap items-center justify-between gap-3">
        <ShelfLife studioId={studioId} canChange={isOwner} />
        {canEdit && <Button onClick={() => setEditing("new")}>Add a stock solution</Button>}
      </div>
      {stocks.error && <Notice tone="danger">{stocks.error.message}</Notice>}
      {old > 0 && (
        <Notice tone="caution" className="mb-3">
          {old === 1 ? "One stock solution is" : `${old} stock solutions are`} past the studio's shelf life: older stock can dye weaker or
          differently. Check it, or mix fresh before a dye lot.
        </Notice>
      )}
      {stocks.data && stocks.data.length === 0 && (
        <EmptyState title="No stock solutions yet">
          {canEdit ? "Log each jar you mix: its strength and the day it was made keep trials repeatable." : "The studio has not logged any stock solutions yet."}
        </EmptyState>
      )}
      {stocks.data && stocks.data.length > 0 && (
        <>
          <Toolbar search={<SearchBox label="Search" placeholder="Dye, lot or notes" value={q} onChange={setQ} />} active={Object.values(filters).filter(Boolean).length}>
            <FilterSelect label="Dye" value={filters.dye} onChange={(v) => setFilters({ ...filters, dye: v })} options={(dyes.data ?? []).map((d) => ({ value: d.id, label: d.name }))} allLabel="Any dye" />
            <FilterSelect label="Age" value={filters.age} onChange={(v) => setFilters({ ...filters, age: v })} options={[{ value: "true", label: "Past shelf life" }, { value: "false", label: "Within shelf life" }]} allLabel="Any age" />
            <FilterSelect
              label="Made"
              value={filters.definition}
              onChange={(v) => setFilters({ ...filters, definition: v })}
              options={[{ value: "to-volume", label: "Up to volume" }, { value: "in-water", label: "In water" }]}
              allLabel="Either way"
            />
          </Toolbar>
          <DataTable
            data={stocks.data}
            columns={columns}
            caption="Stock solutions"
            getRowId={(s) => s.id}
            searchText={(s) => `${s.dye.name} ${s.powderLot} ${s.notes}`}
            globalFilter={q}
            columnFilters={columnFilters}
            initialSorting={[{ id: "mixedOn", desc: true }]}
            noMatch={<EmptyState title="No stock solution matches">Clear a filter or the search.</EmptyState>}
            renderCard={(s) => (
              <div className="space-y-2">
                <div className="flex items-start justify-between gap-2">
                  <div className="flex min-w-0 items-start gap-3">
                    <Swatch hex={s.dye.displayHex} size="lg" />
                    <div className="min-w-0">
                      <p className="font-medium">{s.dye.name}</p>
                      <p className="tabular text-ink-soft">
                        {strength(s)} · {formatAmount(s.volumeMl, units)}
                      </p>
                    </div>
                  </div>
                  {canEdit && (
                    <Button variant="quiet" onClick={() => setEditing(s.id)} aria-label={`Edit the ${s.dye.name} stock`}>
                      Edit
                    </Button>
                  )}
                </div>
                <div className="flex flex-wrap items-center gap-2 text-sm text-ink-soft">
                  <span className="tabular">Mixed {day(s.mixedOn)}</span>
                  <StockAge {...s} />
                </div>
                {s.powderLot && <p className="text-sm text-ink-soft">Powder lot <span className="font-mono">{s.powderLot}</span></p>}
                {s.notes && <p className="text-sm text-ink-soft">{s.notes}</p>}
                {s.dye.sdsUrl && <SdsLink url={s.dye.sdsUrl} name={s.dye.name} />}
              </div>
            )}
          />
        </>
      )}
      <FormDialog title={current ? `Edit the ${current.dye.name} stock` : "Add a stock solution"} open={editing !== null} onClose={() => setEditing(null)}>
        {editing !== null && <StockForm key={editing} studioId={studioId} stock={current} dyes={dyes.data ?? []} canArchive={canArchive} onDone={() => setEditing(null)} />}
      </FormDialog>
    </div>
  );
}
