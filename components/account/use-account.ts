"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "@/components/api";

export interface AccountDto {
  id: string;
  email: string;
  name: string;
  unitSystem: "metric" | "us";
  temperatureUnit: "C" | "F";
  mailEnabled: boolean;
  hasPassword: boolean;
}

export const accountKey = ["account"] as const;

export function useAccount() {
  return useQuery({ queryKey: accountKey, queryFn: () => api<AccountDto>("/api/account"), staleTime: 5 * 60_000 });
}

export function useUpdateAccount() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: Partial<Omit<AccountDto, "id" | "email" | "hasPassword">>) =>
      api<AccountDto>("/api/account", { method: "PATCH", body: input }),
    onSuccess: (a) => qc.setQueryData(accountKey, a),
  });
}
