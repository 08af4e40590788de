"use client";

import { useSyncExternalStore } from "react";

// A tiny store kept in localStorage and shared by every component that reads it, for the few
// things that must outlive a reload besides the query cache: unsent changes, version chains.

export interface LocalStore<T> {
  get(): T;
  set(next: T | ((prev: T) => T)): void;
  subscribe(fn: () => void): () => void;
}

export function localStore<T>(key: string, initial: T): LocalStore<T> {
  const listeners = new Set<() => void>();
  let loaded = false;
  let value = initial;
  const load = () => {
    loaded = true;
    try {
      const raw = localStorage.getItem(key);
      value = raw ? (JSON.parse(raw) as T) : initial;
    } catch {
      /* blocked or unreadable: keep what is in memory */
    }
  };
  return {
    get() {
      if (typeof window === "undefined") return initial;
      if (!loaded) load();
      return value;
    },
    set(next) {
      if (!loaded) load();
      value = typeof next === "function" ? (next as (p: T) => T)(value) : next;
      try {
        localStorage.setItem(key, JSON.stringify(value));
      } catch {
        /* full or blocked: kept in memory for this page */
      }
      listeners.forEach((l) => l());
    },
    subscribe(fn) {
      listeners.add(fn);
      // Another tab changed it.
      const onStorage = (e: StorageEvent) => {
        if (e.key !== key) return;
        load();
        fn();
      };
      window.addEventListener("storage", onStorage);
      return () => {
        listeners.delete(fn);
        window.removeEventListener("storage", onStorage);
      };
    },
  };
}

export function useLocalStore<T>(store: LocalStore<T>, serverValue: T): T {
  return useSyncExternalStore(store.subscribe, store.get, () => serverValue);
}
