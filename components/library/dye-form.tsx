"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useState } from "react";
import { Controller, useForm, useWatch } from "react-hook-form";
import { ApiError } from "@/components/api";
import { Button } from "@/components/ui/button";
import { Field, Select } from "@/components/ui/field";
import { Notice } from "@/components/ui/sheet";
import { DYE_CLASS_LABELS, DYE_CLASS_OPTIONS, type DyeFormValues, type DyeInput, dyeInput } from "@/lib/schemas/library";
import { Swatch } from "./chips";
import { FormActions, TextArea, applyServerError } from "./form-bits";
import { type DyeDto, useArchiveDye, useCreateDye, useUpdateDye } from "./use-dyes";

// Add or edit a dye: its class decides which fibres it colours; the safety sheet is one tap away.

function valuesOf(d?: DyeDto): DyeFormValues {
  return d
    ? { name: d.name, dyeClass: d.dyeClass, form: d.form, colourIndexName: d.colourIndexName ?? "", sdsUrl: d.sdsUrl ?? "", displayHex: d.displayHex, notes: d.notes }
    : { name: "", dyeClass: "acid", form: "powder", colourIndexName: "", sdsUrl: "", displayHex: null, notes: "" };
}

const CLASS_HINTS: Record<DyeFormValues["dyeClass"], string> = {
  acid: "For wool, silk, other animal fibres and nylon, with heat and acid.",
  food: "A blend of acid dyes: it dyes the same fibres, and can split into its parts in the pot.",
  reactive: "Made for cotton, linen and other plant fibres.",
  other: "Anything else; Undertone will not guess which fibres it takes.",
};

export function DyeForm({ studioId, dye, canArchive, onDone }: { studioId: string; dye?: DyeDto; canArchive: boolean; onDone: () => void }) {
  const create = useCreateDye(studioId);
  const update = useUpdateDye(studioId);
  const archive = useArchiveDye(studioId);
  const [version, setVersion] = useState(dye?.version);
  const [message, setMessage] = useState("");
  const [stale, setStale] = useState(false);
  const { register, control, handleSubmit, setError, reset, formState } = useForm<DyeFormValues, unknown, DyeInput>({
    resolver: zodResolver(dyeInput),
    defaultValues: valuesOf(dye),
  });
  const dyeClass = useWatch({ control, name: "dyeClass" });
  const errors = formState.errors;

  const onSubmit = handleSubmit(async (values) => {
    setMessage("");
    try {
      if (dye && version !== undefined) await update.mutateAsync({ id: dye.id, patch: { ...values, version } });
      else await create.mutateAsync(values);
      onDone();
    } catch (e) {
      setStale(e instanceof ApiError && e.status === 409);
      setMessage(applyServerError(e, setError));
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4">
      <Field label="Name" autoComplete="off" {...register("name")} error={errors.name?.message} />
      <div className="grid grid-cols-2 gap-3">
        <Select label="Dye class" {...register("dyeClass")} error={errors.dyeClass?.message}>
          {DYE_CLASS_OPTIONS.map((c) => (
            <option key={c} value={c}>
              {DYE_CLASS_LABELS[c]}
            </option>
          ))}
        </Select>
        <Select label="Comes as" {...register("form")} error={errors.form?.message}>
          <option value="powder">Powder</option>
          <option value="liquid">Liquid</option>
        </Select>
      </div>
      {dyeClass && <p className="-mt-2 text-sm text-ink-soft">{CLASS_HINTS[dyeClass]}</p>}

      <Controller
        control={control}
        name="displayHex"
        render={({ field }) => (
          <div className="space-y-1">
            <span className="block text-sm font-medium text-ink-soft">Display colour</span>
            <div className="flex items-center gap-3">
              <Swatch hex={field.value ?? null} size="lg" />
              {field.value ? (
                <>
                  <input
                    type="color"
                    aria-label="Display colour"
                    value={field.value}
                    onChange={(e) => field.onChange(e.target.value)}
                    className="h-11 w-16 cursor-pointer rounded border border-rule-strong bg-sheet"
                  />
                  <span className="font-mono text-sm">{field.value}</span>
                  <Button variant="quiet" onClick={() => field.onChange(null)}>
                    Remove
                  </Button>
                </>
              ) : (
                <Button variant="plain" onClick={() => field.onChange("#808080")}>
                  Pick a colour
                </Button>
              )}
            </div>
            <p className="text-sm text-ink-faint">Only for telling dyes apart in lists; readings come from your swatches.</p>
            {errors.displayHex && (
              <p role="alert" className="text-sm text-danger">
                {errors.displayHex.message}
              </p>
            )}
          </div>
        )}
      />

      <Field
        label="Safety data sheet (link)"
        type="url"
        inputMode="url"
        placeholder="https://"
        autoComplete="off"
        hint="The maker's safety sheet for this dye. Read it before mixing; local codes and licensed practice come first."
        {...register("sdsUrl")}
        error={errors.sdsUrl?.message}
      />
      <Field
        label="Colour Index name (optional)"
        autoComplete="off"
        placeholder="e.g. Acid Red 1"
        hint="Only when the maker states it."
        {...register("colourIndexName")}
        error={errors.colourIndexName?.message}
      />
      <TextArea label="Notes" {...register("notes")} error={errors.notes?.message} />
      {stale && dye && (
        <Button
          variant="plain"
          onClick={() => {
            reset(valuesOf(dye));
            setVersion(dye.version);
            setStale(false);
            setMessage("");
          }}
        >
          Show the saved version
        </Button>
      )}
      {dye && canArchive && <Notice tone="info">Archiving a dye also archives its stock solutions.</Notice>}
      <FormActions
        what="dye"
        saving={formState.isSubmitting}
        message={message}
        archiving={archive.isPending}
        onArchive={dye && canArchive ? () => archive.mutate(dye.id, { onSuccess: onDone, onError: (e) => setMessage(e.message) }) : undefined}
      />
    </form>
  );
}
