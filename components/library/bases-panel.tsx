"use client";

import type { ColumnDef } from "@tanstack/react-table";
import { useMemo, useState } from "react";
import { useCan, useStudio } from "@/components/studio/studio-context";
import { Button } from "@/components/ui/button";
import { EmptyState, Notice } from "@/components/ui/sheet";
import { fibreWarnings } from "@/lib/library/fibre-check";
import { FIBRE_OPTIONS, WEIGHT_CLASS_LABELS, WEIGHT_CLASS_OPTIONS } from "@/lib/schemas/library";
import { BaseForm } from "./base-form";
import { Chip } from "./chips";
import { DataTable } from "./data-table";
import { FormDialog } from "./form-dialog";
import { FilterSelect, SearchBox, Toolbar, toColumnFilters } from "./toolbar";
import { type BaseDto, useBases } from "./use-bases";

// The Bases tab: every yarn base with its fibres, and what acid dyes will leave pale.

const fibreText = (b: BaseDto) => b.fibres.map((f) => `${f.pct} % ${f.fibre}`).join(", ");
const paleWarnings = (b: BaseDto) => fibreWarnings(b.fibres, "acid", { superwash: b.superwash }).filter((w) => w.kind === "wont-take");

function AcidNote({ base }: { base: BaseDto }) {
  const ws = paleWarnings(base);
  if (!ws.length) return <span className="text-sm text-ink-faint">Takes acid dyes</span>;
  return (
    <ul className="space-y-1">
      {ws.map((w) => (
        <li key={w.message} className="text-sm text-caution">
          {w.message}
        </li>
      ))}
    </ul>
  );
}

export function BasesPanel() {
  const { studioId } = useStudio();
  const canEdit = useCan("library.edit");
  const canArchive = useCan("library.delete");
  const bases = useBases(studioId);
  const [q, setQ] = useState("");
  const [filters, setFilters] = useState({ fibres: "", weightClass: "", superwash: "" });
  const [editing, setEditing] = useState<string | "new" | null>(null);
  const current = editing && editing !== "new" ? bases.data?.find((b) => b.id === editing) : undefined;

  const columns = useMemo<ColumnDef<BaseDto>[]>(
    () => [
      {
        id: "name",
        accessorKey: "name",
        header: "Name",
        sortingFn: "text",
        meta: { label: "Name", sortWords: ["A–Z", "Z–A"] },
        cell: ({ row }) => (
          <div className="min-w-40">
            <p className="font-medium">{row.original.name}</p>
            {row.original.notes && <p className="line-clamp-2 text-sm text-ink-soft">{row.original.notes}</p>}
          </div>
        ),
      },
      {
        id: "fibres",
        accessorFn: fibreText,
        header: "Fibres",
        enableSorting: false,
        filterFn: (row, _id, value: string) => row.original.fibres.some((f) => f.fibre === value),
        cell: ({ row }) => <span className="tabular">{fibreText(row.original)}</span>,
      },
      {
        id: "superwash",
        accessorFn: (b) => String(b.superwash),
        header: "Superwash",
        enableSorting: false,
        filterFn: "equalsString",
        cell: ({ row }) => (row.original.superwash ? <Chip tone="accent">superwash</Chip> : <span className="text-ink-faint">no</span>),
      },
      {
        id: "weightClass",
        accessorFn: (b) => WEIGHT_CLASS_OPTIONS.indexOf(b.weightClass),
        header: "Weight",
        filterFn: (row, _id, value: string) => row.original.weightClass === value,
        meta: { label: "Weight", sortWords: ["finest first", "heaviest first"] },
        cell: ({ row }) => WEIGHT_CLASS_LABELS[row.original.weightClass],
      },
      {
        id: "metres",
        accessorKey: "metresPer100g",
        header: "m / 100 g",
        sortUndefined: "last",
        meta: { label: "Metres per 100 g", cellClass: "text-right tabular", sortWords: ["fewest first", "most first"] },
        cell: ({ row }) => row.original.metresPer100g ?? "—",
      },
      { id: "acid", header: "With acid dyes", enableSorting: false, cell: ({ row }) => <AcidNote base={row.original} /> },
      ...(canEdit
        ? [
            {
              id: "edit",
              header: () => <span className="sr-only">Edit</span>,
              enableSorting: false,
              cell: ({ row }) => (
                <Button variant="quiet" onClick={() => setEditing(row.original.id)} aria-label={`Edit ${row.original.name}`}>
                  Edit
                </Button>
              ),
            } satisfies ColumnDef<BaseDto>,
          ]
        : []),
    ],
    [canEdit],
  );

  return (
    <div>
      <div className="mb-3 flex flex-wrap items-center justify-between gap-3">
        <p className="text-ink-soft">The yarns you dye on, with what they are made of.</p>
        {canEdit && <Button onClick={() => setEditing("new")}>Add a base</Button>}
      </div>
      {bases.error && <Notice tone="danger">{bases.error.message}</Notice>}
      {bases.data && bases.data.length === 0 && (
        <EmptyState title="No yarn bases yet">{canEdit ? "Add the yarns you dye on: trials and lots are logged against them." : "The studio has not listed any bases yet."}</EmptyState>
      )}
      {bases.data && bases.data.length > 0 && (
        <>
          <Toolbar search={<SearchBox label="Search" placeholder="Name or notes" value={q} onChange={setQ} />} active={Object.values(filters).filter(Boolean).length}>
            <FilterSelect label="Fibre" value={filters.fibres} onChange={(v) => setFilters({ ...filters, fibres: v })} options={FIBRE_OPTIONS.map((f) => ({ value: f, label: f }))} allLabel="Any fibre" />
            <FilterSelect label="Weight" value={filters.weightClass} onChange={(v) => setFilters({ ...filters, weightClass: v })} options={WEIGHT_CLASS_OPTIONS.map((w) => ({ value: w, label: WEIGHT_CLASS_LABELS[w] }))} allLabel="Any weight" />
            <FilterSelect
              label="Superwash"
              value={filters.superwash}
              onChange={(v) => setFilters({ ...filters, superwash: v })}
              options={[{ value: "true", label: "Superwash" }, { value: "false", label: "Not superwash" }]}
              allLabel="Either"
            />
          </Toolbar>
          <DataTable
            data={bases.data}
            columns={columns}
            caption="Yarn bases"
            getRowId={(b) => b.id}
            searchText={(b) => `${b.name} ${b.notes}`}
            globalFilter={q}
            columnFilters={toColumnFilters(filters)}
            initialSorting={[{ id: "name", desc: false }]}
            noMatch={<EmptyState title="No base matches">Clear a filter or the search.</EmptyState>}
            renderCard={(b) => (
              <div className="space-y-2">
                <div className="flex items-start justify-between gap-2">
                  <div className="min-w-0">
                    <p className="font-medium">{b.name}</p>
                    <p className="tabular text-ink-soft">{fibreText(b)}</p>
                  </div>
                  {canEdit && (
                    <Button variant="quiet" onClick={() => setEditing(b.id)} aria-label={`Edit ${b.name}`}>
                      Edit
                    </Button>
                  )}
                </div>
                <div className="flex flex-wrap gap-2">
                  <Chip>{WEIGHT_CLASS_LABELS[b.weightClass]}</Chip>
                  {b.metresPer100g !== null && <Chip>{b.metresPer100g} m / 100 g</Chip>}
                  {b.superwash && <Chip tone="accent">superwash</Chip>}
                </div>
                {paleWarnings(b).length > 0 && <AcidNote base={b} />}
                {b.notes && <p className="text-sm text-ink-soft">{b.notes}</p>}
              </div>
            )}
          />
        </>
      )}
      <FormDialog title={current ? `Edit ${current.name}` : "Add a yarn base"} open={editing !== null} onClose={() => setEditing(null)}>
        {editing !== null && <BaseForm key={editing} studioId={studioId} base={current} canArchive={canArchive} onDone={() => setEditing(null)} />}
      </FormDialog>
    </div>
  );
}
