"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";
import { useEffect } from "react";
import { NavIcon } from "./nav-icons";
import { navItems } from "./nav-items";

/** Bottom bar on a phone (in thumb reach), a side rail from the small-laptop width up. */
export function StudioNav({ studioId, role }: { studioId: string; role: string }) {
  const pathname = usePathname();
  const base = `/s/${studioId}`;
  useEffect(() => {
    document.cookie = `ut-studio=${studioId}; path=/; max-age=31536000; samesite=lax`;
  }, [studioId]);
  const items = navItems.filter((i) => !i.roles || i.roles.includes(role as never));
  return (
    <nav
      aria-label="Studio"
      className="no-print fixed inset-x-0 bottom-0 z-30 border-t border-rule bg-sheet/95 pb-[env(safe-area-inset-bottom)] backdrop-blur md:static md:w-52 md:shrink-0 md:border-t-0 md:border-r md:bg-transparent md:pb-0"
    >
      <ul className="mx-auto flex max-w-xl justify-around md:sticky md:top-4 md:flex-col md:gap-1 md:px-3 md:pt-2">
        {items.map((item) => {
          const href = base + item.path;
          const active = item.path === "" ? pathname === base : pathname.startsWith(href);
          return (
            <li key={item.path} className="flex-1 md:flex-none">
              <Link
                href={href}
                aria-current={active ? "page" : undefined}
                className={`flex min-h-14 flex-col items-center justify-center gap-0.5 px-1 text-xs md:min-h-11 md:flex-row md:justify-start md:gap-3 md:rounded-md md:px-3 md:text-base ${
                  active ? "text-accent md:bg-accent-soft" : "text-ink-soft hover:text-ink"
                }`}
              >
                <NavIcon icon={item.icon} />
                <span>{item.label}</span>
              </Link>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}
