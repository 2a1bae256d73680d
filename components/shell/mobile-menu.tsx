"use client";

import { useState } from "react";
import { NavLinks, type NavItem } from "./nav-links";

export function MobileMenu({ items, footer }: { items: NavItem[]; footer: React.ReactNode }) {
  const [open, setOpen] = useState(false);
  return (
    <div>
      <button type="button" className="btn border border-gauge-600 text-white" aria-expanded={open} aria-controls="mobile-nav" onClick={() => setOpen((o) => !o)}>
        Menu
      </button>
      {open && (
        <div id="mobile-nav" className="absolute inset-x-0 top-full z-40 space-y-4 bg-gauge-900 px-4 pb-5 pt-2 shadow-lg">
          <nav aria-label="Main">
            <NavLinks items={items} onNavigate={() => setOpen(false)} />
          </nav>
          <div className="space-y-3 border-t border-gauge-800 pt-3">{footer}</div>
        </div>
      )}
    </div>
  );
}
