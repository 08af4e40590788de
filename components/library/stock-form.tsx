"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useState } from "react";
import { Controller, useForm, useWatch } from "react-hook-form";
import { useAccount } from "@/components/account/use-account";
import { ApiError } from "@/components/api";
import { Button } from "@/components/ui/button";
import { Field, Select } from "@/components/ui/field";
import { Notice } from "@/components/ui/sheet";
import { type StockFormValues, type StockInput, stockInput } from "@/lib/schemas/library";
import { FormActions, TextArea, applyServerError } from "./form-bits";
import { SdsLink } from "./sds-link";
import type { DyeDto } from "./use-dyes";
import { type StockDto, useArchiveStock, useCreateStock, useUpdateStock } from "./use-stocks";
import { VolumeField } from "./volume-field";

// Log a jar of stock solution: which dye, how strong, how it was defined, when it was mixed.

const today = () => new Date().toLocaleDateString("en-CA"); // YYYY-MM-DD in the dyer's own time zone

function valuesOf(s: StockDto | undefined, dyes: DyeDto[]): StockFormValues {
  return s
    ? { dyeId: s.dye.id, concentrationPct: s.concentrationPct, definition: s.definition, volumeMl: s.volumeMl, mixedOn: s.mixedOn, powderLot: s.powderLot, notes: s.notes }
    : { dyeId: dyes[0]?.id ?? "", concentrationPct: 1, definition: "to-volume", volumeMl: 500, mixedOn: today(), powderLot: "", notes: "" };
}

export function StockForm({
  studioId,
  stock,
  dyes,
  canArchive,
  onDone,
}: {
  studioId: string;
  stock?: StockDto;
  dyes: DyeDto[];
  canArchive: boolean;
  onDone: () => void;
}) {
  const create = useCreateStock(studioId);
  const update = useUpdateStock(studioId);
  const archive = useArchiveStock(studioId);
  const account = useAccount();
  const [version, setVersion] = useState(stock?.version);
  const [message, setMessage] = useState("");
  const [stale, setStale] = useState(false);
  const { register, control, handleSubmit, setError, reset, formState } = useForm<StockFormValues, unknown, StockInput>({
    resolver: zodResolver(stockInput),
    defaultValues: valuesOf(stock, dyes),
  });
  const errors = formState.errors;
  const dyeId = useWatch({ control, name: "dyeId" });
  const dye = dyes.find((d) => d.id === dyeId);
  // An archived dye stays selectable on a stock that already uses it.
  const options = stock && !dyes.some((d) => d.id === stock.dye.id) ? [{ id: stock.dye.id, name: `${stock.dye.name} (archived)` }, ...dyes] : dyes;

  const onSubmit = handleSubmit(async (values) => {
    setMessage("");
    try {
      if (stock && version !== undefined) await update.mutateAsync({ id: stock.id, patch: { ...values, version } });
      else await create.mutateAsync(values);
      onDone();
    } catch (e) {
      setStale(e instanceof ApiError && e.status === 409);
      setMessage(applyServerError(e, setError));
    }
  });

  if (!stock && dyes.length === 0) return <Notice tone="info">Add a dye to the library first: a stock solution is made from one.</Notice>;

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4">
      <Select label="Dye" {...register("dyeId")} error={errors.dyeId?.message}>
        {options.map((d) => (
          <option key={d.id} value={d.id}>
            {d.name}
          </option>
        ))}
      </Select>
      {dye && (
        <Notice tone="caution">
          {dye.form === "powder" && (
            <p>Dye powder can sensitise lungs and skin: wet it before stirring or wear a respirator rated for fine dust, and keep gloves on.</p>
          )}
          <p>Label the jar and keep it from children, pets and food: stock solutions look like drinks.</p>
          <p className="mt-1 text-ink-soft">The dye&apos;s safety data sheet, local rules and licensed practice come first.</p>
          <SdsLink url={dye.sdsUrl} name={dye.name} />
        </Notice>
      )}
      <Field
        label="Concentration (%)"
        type="number"
        inputMode="decimal"
        step="any"
        min={0}
        {...register("concentrationPct", { valueAsNumber: true })}
        hint="A 1 % stock holds 1 g of dye per 100 ml."
        error={errors.concentrationPct?.message}
      />
      <fieldset className="space-y-2">
        <legend className="text-sm font-medium text-ink-soft">How it was made</legend>
        <label className="flex min-h-11 cursor-pointer items-start gap-3">
          <input type="radio" value="to-volume" className="mt-1 h-6 w-6 accent-accent" {...register("definition")} />
          <span>
            <span className="block font-medium">Made up to volume</span>
            <span className="block text-sm text-ink-soft">Dye dissolved, then water added up to the mark (1 g made up to 100 ml).</span>
          </span>
        </label>
        <label className="flex min-h-11 cursor-pointer items-start gap-3">
          <input type="radio" value="in-water" className="mt-1 h-6 w-6 accent-accent" {...register("definition")} />
          <span>
            <span className="block font-medium">In water</span>
            <span className="block text-sm text-ink-soft">Dye added to a measured amount of water (1 g in 100 g of water).</span>
          </span>
        </label>
        {errors.definition && (
          <p role="alert" className="text-sm text-danger">
            {errors.definition.message}
          </p>
        )}
      </fieldset>
      <Controller
        control={control}
        name="volumeMl"
        render={({ field }) => (
          <VolumeField label="Volume" value={field.value} onChange={field.onChange} error={errors.volumeMl?.message} unitSystem={account.data?.unitSystem ?? "metric"} />
        )}
      />
      <div className="grid grid-cols-2 gap-3">
        <Field label="Mixed on" type="date" max={today()} {...register("mixedOn")} error={errors.mixedOn?.message} />
        <Field label="Powder lot" autoComplete="off" {...register("powderLot")} error={errors.powderLot?.message} />
      </div>
      <TextArea label="Notes" {...register("notes")} error={errors.notes?.message} />
      {stale && stock && (
        <Button
          variant="plain"
          onClick={() => {
            reset(valuesOf(stock, dyes));
            setVersion(stock.version);
            setStale(false);
            setMessage("");
          }}
        >
          Show the saved version
        </Button>
      )}
      <FormActions
        what="stock solution"
        saving={formState.isSubmitting}
        message={message}
        archiving={archive.isPending}
        onArchive={stock && canArchive ? () => archive.mutate(stock.id, { onSuccess: onDone, onError: (e) => setMessage(e.message) }) : undefined}
      />
    </form>
  );
}
