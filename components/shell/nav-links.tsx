"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";

export type NavItem = { href: string; label: string; planned: boolean };

export function NavLinks({ items, onNavigate }: { items: NavItem[]; onNavigate?: () => void }) {
  const pathname = usePathname();
  return (
    <ul className="space-y-0.5" data-testid="main-nav">
      {items.map((item) => {
        const current = pathname === item.href || pathname.startsWith(`${item.href}/`);
        return (
          <li key={item.href}>
            <Link
              href={item.href}
              onClick={onNavigate}
              aria-current={current ? "page" : undefined}
              className={`flex items-center justify-between rounded-md px-3 py-2 text-sm ${current ? "bg-gauge-700 font-medium text-white" : "text-gauge-100 hover:bg-gauge-800"}`}
            >
              {item.label}
              {item.planned && <span className="text-[10px] uppercase tracking-wide text-gauge-400">planned</span>}
            </Link>
          </li>
        );
      })}
    </ul>
  );
}
