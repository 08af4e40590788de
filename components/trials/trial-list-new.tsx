"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import { ApiError } from "@/components/api";
import { Button } from "@/components/ui/button";
import { Field, Select } from "@/components/ui/field";
import { Notice } from "@/components/ui/sheet";
import { type TrialInput, trialInput } from "@/lib/schemas/trial";
import type { TrialFacets } from "@/lib/trials/types";
import { TrialListDialog } from "./trial-list-dialog";
import { useCreateTrial } from "./use-trials";

// Starting a trial takes three answers: what it is, which base, and the weighed dry fibre. The
// layers are added on the trial's own page.

export function NewTrialDialog({
  studioId,
  open,
  onClose,
  facets,
}: {
  studioId: string;
  open: boolean;
  onClose: () => void;
  facets: TrialFacets | undefined;
}) {
  const router = useRouter();
  const create = useCreateTrial();
  const form = useForm<TrialInput>({
    resolver: zodResolver(trialInput),
    defaultValues: { title: "", fibreWeightG: 100 },
  });
  const { errors } = form.formState;
  const serverFields = create.error instanceof ApiError ? create.error.fields : undefined;

  const submit = form.handleSubmit((input) =>
    create.mutate(
      { studioId, input },
      {
        onSuccess: (t) => {
          form.reset();
          onClose();
          router.push(`/s/${studioId}/trials/${t.id}`);
        },
      },
    ),
  );

  return (
    <TrialListDialog
      open={open}
      onClose={onClose}
      title="New trial"
      footer={
        <Button type="submit" form="new-trial" className="w-full" disabled={create.isPending}>
          {create.isPending ? "Starting…" : "Start the trial"}
        </Button>
      }
    >
      <form id="new-trial" className="space-y-4" onSubmit={submit} noValidate>
        <Field
          label="What are you trying?"
          placeholder="e.g. Green dip that breaks at the tips"
          autoComplete="off"
          error={errors.title?.message ?? serverFields?.title}
          {...form.register("title")}
        />
        <Select
          label="Base"
          error={errors.baseId?.message ?? serverFields?.baseId}
          {...form.register("baseId", { setValueAs: (v) => (v ? v : null) })}
        >
          <option value="">No base yet</option>
          {facets?.bases.map((b) => (
            <option key={b.id} value={b.id}>
              {b.name}
            </option>
          ))}
        </Select>
        <Field
          label="Dry fibre weight (g)"
          inputMode="decimal"
          hint="Weigh the dry skein: a “100 g” skein is often 95–105 g."
          error={errors.fibreWeightG?.message ?? serverFields?.fibreWeightG}
          {...form.register("fibreWeightG", { setValueAs: (v) => (v === "" ? undefined : Number(String(v).replace(",", "."))) })}
        />
        {create.error && !serverFields && <Notice tone="danger">{create.error.message}</Notice>}
      </form>
    </TrialListDialog>
  );
}
