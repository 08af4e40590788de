"use client";

import type { ColumnDef } from "@tanstack/react-table";
import { useMemo, useState } from "react";
import { useCan, useStudio } from "@/components/studio/studio-context";
import { Button } from "@/components/ui/button";
import { EmptyState, Notice } from "@/components/ui/sheet";
import { DYE_CLASS_LABELS, DYE_CLASS_OPTIONS } from "@/lib/schemas/library";
import { Swatch } from "./chips";
import { DataTable } from "./data-table";
import { DyeForm } from "./dye-form";
import { FormDialog } from "./form-dialog";
import { SdsLink } from "./sds-link";
import { FilterSelect, SearchBox, Toolbar, toColumnFilters } from "./toolbar";
import { type DyeDto, useDyes } from "./use-dyes";

// The Dyes tab: each dye with its class, form and safety sheet.

export function DyesPanel() {
  const { studioId } = useStudio();
  const canEdit = useCan("library.edit");
  const canArchive = useCan("library.delete");
  const dyes = useDyes(studioId);
  const [q, setQ] = useState("");
  const [filters, setFilters] = useState({ dyeClass: "", form: "" });
  const [editing, setEditing] = useState<string | "new" | null>(null);
  const current = editing && editing !== "new" ? dyes.data?.find((d) => d.id === editing) : undefined;

  const columns = useMemo<ColumnDef<DyeDto>[]>(
    () => [
      {
        id: "name",
        accessorKey: "name",
        header: "Name",
        sortingFn: "text",
        meta: { label: "Name", sortWords: ["A–Z", "Z–A"] },
        cell: ({ row }) => (
          <div className="flex min-w-40 items-start gap-2">
            <Swatch hex={row.original.displayHex} />
            <div>
              <p className="font-medium">{row.original.name}</p>
              {row.original.colourIndexName && <p className="text-sm text-ink-soft">C.I. {row.original.colourIndexName.replace(/^C\.?\s?I\.?\s+/i, "")}</p>}
            </div>
          </div>
        ),
      },
      {
        id: "dyeClass",
        accessorFn: (d) => DYE_CLASS_OPTIONS.indexOf(d.dyeClass),
        header: "Class",
        filterFn: (row, _id, v: string) => row.original.dyeClass === v,
        meta: { label: "Class", sortWords: ["acid first", "other first"] },
        cell: ({ row }) => DYE_CLASS_LABELS[row.original.dyeClass],
      },
      {
        id: "form",
        accessorKey: "form",
        header: "Form",
        enableSorting: false,
        filterFn: "equalsString",
        cell: ({ row }) => row.original.form,
      },
      {
        id: "sds",
        header: "Safety",
        enableSorting: false,
        cell: ({ row }) => <SdsLink url={row.original.sdsUrl} name={row.original.name} />,
      },
      {
        id: "notes",
        accessorKey: "notes",
        header: "Notes",
        enableSorting: false,
        cell: ({ row }) => <p className="line-clamp-2 max-w-72 text-sm text-ink-soft">{row.original.notes}</p>,
      },
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
            } satisfies ColumnDef<DyeDto>,
          ]
        : []),
    ],
    [canEdit],
  );

  return (
    <div>
      <div className="mb-3 flex flex-wrap items-center justify-between gap-3">
        <p className="text-ink-soft">Powders and liquids, each with its class and safety sheet.</p>
        {canEdit && <Button onClick={() => setEditing("new")}>Add a dye</Button>}
      </div>
      {dyes.error && <Notice tone="danger">{dyes.error.message}</Notice>}
      {dyes.data && dyes.data.length === 0 && (
        <EmptyState title="No dyes yet">{canEdit ? "Add the dyes on your shelf, with a link to each one's safety sheet." : "The studio has not listed any dyes yet."}</EmptyState>
      )}
      {dyes.data && dyes.data.length > 0 && (
        <>
          <Toolbar search={<SearchBox label="Search" placeholder="Name, Colour Index or notes" value={q} onChange={setQ} />} active={Object.values(filters).filter(Boolean).length}>
            <FilterSelect label="Class" value={filters.dyeClass} onChange={(v) => setFilters({ ...filters, dyeClass: v })} options={DYE_CLASS_OPTIONS.map((c) => ({ value: c, label: DYE_CLASS_LABELS[c] }))} allLabel="Any class" />
            <FilterSelect label="Form" value={filters.form} onChange={(v) => setFilters({ ...filters, form: v })} options={[{ value: "powder", label: "Powder" }, { value: "liquid", label: "Liquid" }]} allLabel="Either" />
          </Toolbar>
          <DataTable
            data={dyes.data}
            columns={columns}
            caption="Dyes"
            getRowId={(d) => d.id}
            searchText={(d) => `${d.name} ${d.colourIndexName ?? ""} ${d.notes}`}
            globalFilter={q}
            columnFilters={toColumnFilters(filters)}
            initialSorting={[{ id: "name", desc: false }]}
            noMatch={<EmptyState title="No dye matches">Clear a filter or the search.</EmptyState>}
            renderCard={(d) => (
              <div className="space-y-2">
                <div className="flex items-start justify-between gap-2">
                  <div className="flex min-w-0 items-start gap-3">
                    <Swatch hex={d.displayHex} size="lg" />
                    <div className="min-w-0">
                      <p className="font-medium">{d.name}</p>
                      <p className="text-sm text-ink-soft">
                        {DYE_CLASS_LABELS[d.dyeClass]} · {d.form}
                        {d.colourIndexName && ` · C.I. ${d.colourIndexName.replace(/^C\.?\s?I\.?\s+/i, "")}`}
                      </p>
                    </div>
                  </div>
                  {canEdit && (
                    <Button variant="quiet" onClick={() => setEditing(d.id)} aria-label={`Edit ${d.name}`}>
                      Edit
                    </Button>
                  )}
                </div>
                <SdsLink url={d.sdsUrl} name={d.name} />
                {d.notes && <p className="text-sm text-ink-soft">{d.notes}</p>}
              </div>
            )}
          />
        </>
      )}
      <FormDialog title={current ? `Edit ${current.name}` : "Add a dye"} open={editing !== null} onClose={() => setEditing(null)}>
        {editing !== null && <DyeForm key={editing} studioId={studioId} dye={current} canArchive={canArchive} onDone={() => setEditing(null)} />}
      </FormDialog>
    </div>
  );
}
