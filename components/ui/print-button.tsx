"use client";

import { Button } from "./button";

export function PrintButton({ label = "Print this page" }: { label?: string }) {
  return <Button onClick={() => window.print()}>{label}</Button>;
}
