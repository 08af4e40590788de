"use client";

import { signOut } from "next-auth/react";
import Link from "next/link";
import { Button } from "@/components/ui/button";
import { Notice, Sheet, SectionTitle } from "@/components/ui/sheet";
import { useAccount, useUpdateAccount } from "./use-account";

function Choice<T extends string>({
  legend,
  value,
  options,
  onChange,
}: {
  legend: string;
  value: T;
  options: { value: T; label: string }[];
  onChange: (v: T) => void;
}) {
  return (
    <fieldset>
      <legend className="mb-1 text-sm font-medium text-ink-soft">{legend}</legend>
      <div className="grid grid-cols-2 gap-2">
        {options.map((o) => (
          <label
            key={o.value}
            className={`flex min-h-11 cursor-pointer items-center justify-center rounded-md border px-3 text-center ${
              value === o.value ? "border-accent bg-accent-soft text-accent" : "border-rule-strong bg-sheet"
            }`}
          >
            <input type="radio" className="sr-only" checked={value === o.value} onChange={() => onChange(o.value)} />
            {o.label}
          </label>
        ))}
      </div>
    </fieldset>
  );
}

export function AccountClient() {
  const account = useAccount();
  const update = useUpdateAccount();
  const a = account.data;
  return (
    <div className="space-y-5">
      <h1 className="text-3xl">Account</h1>
      {a && (
        <Sheet className="space-y-5">
          <SectionTitle>{a.name}</SectionTitle>
          <p className="-mt-3 text-ink-soft">{a.email}</p>
          <Choice
            legend="Amounts"
            value={a.unitSystem}
            options={[
              { value: "metric", label: "Metric (g, ml)" },
              { value: "us", label: "US kitchen (tsp, cup)" },
            ]}
            onChange={(unitSystem) => update.mutate({ unitSystem })}
          />
          <Choice
            legend="Temperature"
            value={a.temperatureUnit}
            options={[
              { value: "C", label: "°C" },
              { value: "F", label: "°F" },
            ]}
            onChange={(temperatureUnit) => update.mutate({ temperatureUnit })}
          />
          <Choice
            legend="E-mail about comments and mentions"
            value={a.mailEnabled ? "on" : "off"}
            options={[
              { value: "on", label: "Send me mail" },
              { value: "off", label: "No mail" },
            ]}
            onChange={(v) => update.mutate({ mailEnabled: v === "on" })}
          />
          {update.error && <Notice tone="danger">{update.error.message}</Notice>}
        </Sheet>
      )}
      <div className="flex flex-wrap gap-3">
        <Link href="/studios" className="inline-flex min-h-11 items-center text-accent underline underline-offset-4">
          Your studios
        </Link>
        <Button variant="plain" onClick={() => signOut({ callbackUrl: "/signin" })}>
          Sign out
        </Button>
      </div>
    </div>
  );
}
