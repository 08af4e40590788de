"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useState } from "react";
import { useFieldArray, useForm, useWatch } from "react-hook-form";
import { ApiError } from "@/components/api";
import { Button } from "@/components/ui/button";
import { Field, Select } from "@/components/ui/field";
import { Notice } from "@/components/ui/sheet";
import { fibreWarnings } from "@/lib/library/fibre-check";
import { type BaseFormValues, type BaseInput, FIBRE_OPTIONS, WEIGHT_CLASS_LABELS, WEIGHT_CLASS_OPTIONS, baseInput, fibreTotal } from "@/lib/schemas/library";
import { CheckRow, FormActions, TextArea, applyServerError } from "./form-bits";
import { type BaseDto, useArchiveBase, useCreateBase, useUpdateBase } from "./use-bases";

// Add or edit a yarn base. Fibres are a short list of rows that must add up to 100 %.

function valuesOf(b?: BaseDto): BaseFormValues {
  return b
    ? { name: b.name, fibres: b.fibres, superwash: b.superwash, weightClass: b.weightClass, metresPer100g: b.metresPer100g, notes: b.notes }
    : { name: "", fibres: [{ fibre: "wool", pct: 100 }], superwash: false, weightClass: "fingering", metresPer100g: null, notes: "" };
}

export function BaseForm({ studioId, base, canArchive, onDone }: { studioId: string; base?: BaseDto; canArchive: boolean; onDone: () => void }) {
  const create = useCreateBase(studioId);
  const update = useUpdateBase(studioId);
  const archive = useArchiveBase(studioId);
  const [version, setVersion] = useState(base?.version);
  const [message, setMessage] = useState("");
  const [stale, setStale] = useState(false);
  const form = useForm<BaseFormValues, unknown, BaseInput>({ resolver: zodResolver(baseInput), defaultValues: valuesOf(base) });
  const { register, control, handleSubmit, setError, reset, formState } = form;
  const { fields, append, remove } = useFieldArray({ control, name: "fibres" });
  const fibres = useWatch({ control, name: "fibres" }) ?? [];
  const superwash = useWatch({ control, name: "superwash" });
  const total = fibreTotal(fibres.map((f) => ({ pct: Number(f?.pct) })));
  const fibreError = formState.errors.fibres?.root?.message ?? formState.errors.fibres?.message;
  const valid = fibres.filter((f) => f?.fibre && Number(f.pct) > 0).map((f) => ({ fibre: f.fibre, pct: Number(f.pct) }));
  const warnings = fibreWarnings(valid, "acid", { superwash: !!superwash });

  const onSubmit = handleSubmit(async (values) => {
    setMessage("");
    try {
      if (base && version !== undefined) await update.mutateAsync({ id: base.id, patch: { ...values, version } });
      else await create.mutateAsync(values);
      onDone();
    } catch (e) {
      setStale(e instanceof ApiError && e.status === 409);
      setMessage(applyServerError(e, setError));
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4">
      <Field label="Name" autoComplete="off" {...register("name")} error={formState.errors.name?.message} />

      <fieldset className="space-y-2">
        <legend className="text-sm font-medium text-ink-soft">Fibre content</legend>
        {fields.map((f, i) => (
          <div key={f.id} className="flex items-end gap-2">
            <Select label={`Fibre ${i + 1}`} className="flex-1" {...register(`fibres.${i}.fibre`)} error={formState.errors.fibres?.[i]?.fibre?.message}>
              {FIBRE_OPTIONS.map((o) => (
                <option key={o} value={o}>
                  {o}
                </option>
              ))}
            </Select>
            <Field
              label="%"
              type="number"
              inputMode="decimal"
              step="any"
              min={0}
              max={100}
              className="w-24"
              {...register(`fibres.${i}.pct`, { valueAsNumber: true })}
              error={formState.errors.fibres?.[i]?.pct?.message}
            />
            <Button variant="quiet" aria-label={`Remove fibre ${i + 1}`} disabled={fields.length === 1} onClick={() => remove(i)}>
              ✕
            </Button>
          </div>
        ))}
        <div className="flex flex-wrap items-center justify-between gap-2">
          <Button
            variant="plain"
            disabled={fields.length >= 8}
            onClick={() => {
              const used = new Set(fibres.map((f) => f?.fibre));
              append({ fibre: FIBRE_OPTIONS.find((o) => !used.has(o)) ?? "other", pct: Math.max(0, Math.round((100 - total) * 100) / 100) });
            }}
          >
            Add a fibre
          </Button>
          <p className={`tabular text-sm ${total === 100 ? "text-ok" : "text-caution"}`} aria-live="polite">
            Total {total} %{total === 100 ? " ✓" : " — must make 100 %"}
          </p>
        </div>
        {fibreError && (
          <p role="alert" className="text-sm text-danger">
            {fibreError}
          </p>
        )}
      </fieldset>

      {warnings.some((w) => w.level === "warning") && (
        <Notice tone="caution">
          <p className="font-medium">With acid dyes</p>
          <ul className="mt-1 list-disc space-y-1 pl-5">
            {warnings.filter((w) => w.level === "warning").map((w) => (
              <li key={w.kind}>{w.message}</li>
            ))}
          </ul>
        </Notice>
      )}
      {warnings.some((w) => w.level === "note") && (
        <ul className="space-y-1 text-sm text-ink-soft">
          {warnings.filter((w) => w.level === "note").map((w) => (
            <li key={w.kind}>{w.message}</li>
          ))}
        </ul>
      )}

      <CheckRow label="Superwash" hint="Treated so it does not felt in the wash." {...register("superwash")} />
      <div className="grid grid-cols-2 gap-3">
        <Select label="Weight" {...register("weightClass")} error={formState.errors.weightClass?.message}>
          {WEIGHT_CLASS_OPTIONS.map((w) => (
            <option key={w} value={w}>
              {WEIGHT_CLASS_LABELS[w]}
            </option>
          ))}
        </Select>
        <Field
          label="Metres per 100 g"
          type="number"
          inputMode="decimal"
          step="any"
          min={0}
          {...register("metresPer100g", { setValueAs: (v) => (v === "" || v === null || v === undefined ? null : Number(v)) })}
          error={formState.errors.metresPer100g?.message}
        />
      </div>
      <TextArea label="Notes" {...register("notes")} error={formState.errors.notes?.message} />
      {stale && base && (
        <Button
          variant="plain"
          onClick={() => {
            reset(valuesOf(base));
            setVersion(base.version);
            setStale(false);
            setMessage("");
          }}
        >
          Show the saved version
        </Button>
      )}
      <FormActions
        what="base"
        saving={formState.isSubmitting}
        message={message}
        archiving={archive.isPending}
        onArchive={base && canArchive ? () => archive.mutate(base.id, { onSuccess: onDone, onError: (e) => setMessage(e.message) }) : undefined}
      />
    </form>
  );
}
