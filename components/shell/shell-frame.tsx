"use client";

import { usePathname } from "next/navigation";

/** Screens that are workspaces: they fill the window and keep the navigation behind the menu. */
export function isWorkspacePath(pathname: string): boolean {
  return /^\/units\/[^/]+\/?$/.test(pathname) || /^\/recheck\/[0-9a-f]{8}-[0-9a-f-]{27}\/?$/i.test(pathname);
}

/**
 * Lays the shell out by screen: ordinary pages get the navigation column (from lg up) and scroll;
 * a workspace (the Bench) gets only the slim top bar at every width and the whole window below
 * it, so its canvas is as large as the screen allows and nothing above it scrolls away.
 */
export function ShellFrame({ sidebar, topBar, children }: { sidebar: React.ReactNode; topBar: React.ReactNode; children: React.ReactNode }) {
  const workspace = isWorkspacePath(usePathname());
  return (
    <div className={workspace ? "relative flex h-dvh flex-col overflow-hidden" : "min-h-screen lg:flex"} data-shell={workspace ? "workspace" : "page"}>
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-50 focus:rounded focus:bg-white focus:px-3 focus:py-2">
        Skip to content
      </a>
      {!workspace && sidebar}
      <div className={workspace ? "relative shrink-0" : "relative lg:hidden"}>{topBar}</div>
      <main id="main" className={workspace ? "min-h-0 min-w-0 flex-1 px-2 pt-2 pb-2 sm:px-3" : "min-w-0 flex-1 px-4 py-6 sm:px-8"}>
        {children}
      </main>
    </div>
  );
}
