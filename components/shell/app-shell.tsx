import Link from "next/link";
import type { SessionUser } from "@/lib/auth/require-user";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { describeTimeZone } from "@/lib/time/format";
import type { Screen } from "@/lib/nav";
import { Wordmark } from "@/components/ui/logo";
import { NavLinks } from "./nav-links";
import { SignOutButton } from "./sign-out-button";
import { MobileMenu } from "./mobile-menu";
import { ShellFrame } from "./shell-frame";

/** The frame around every signed-in page: navigation for the user's roles, who is signed in. */
export function AppShell({ user, screens, children }: { user: SessionUser; screens: Screen[]; children: React.ReactNode }) {
  const nav = screens.map(({ href, label, status }) => ({ href, label, planned: status === "planned" }));
  const zone = `Times in ${describeTimeZone(user.timeZone)}`;
  // The zone is named once where the page shows it: in the sidebar beside the name, or in the slim
  // top bar (phones, and the Bench, whose menu is closed while times are on screen).
  const who = (withZone: boolean) => (
    <div className="text-sm" data-testid="signed-in-user">
      <div className="font-medium">{user.name}</div>
      <div className="text-gauge-300">{user.workspaceName}</div>
      {withZone && (
        <div className="mt-1 text-xs text-gauge-300" data-testid="time-zone-note">
          {zone}
        </div>
      )}
      <div className="mt-1 flex flex-wrap gap-1" aria-label="Your roles">
        {user.roles.map((r) => (
          <span key={r} className="rounded bg-gauge-800 px-1.5 py-0.5 text-xs text-gauge-100">
            {ROLE_LABELS[r]}
          </span>
        ))}
      </div>
    </div>
  );
  return (
    <ShellFrame
      sidebar={
        <aside className="hidden w-60 shrink-0 flex-col bg-gauge-900 text-white lg:flex">
          <Link href="/" className="px-5 py-5">
            <Wordmark />
          </Link>
          <nav aria-label="Main" className="flex-1 px-3">
            <NavLinks items={nav} />
          </nav>
          <div className="space-y-3 border-t border-gauge-800 px-5 py-4">
            {who(true)}
            <SignOutButton />
          </div>
        </aside>
      }
      topBar={
        <header className="flex items-center justify-between bg-gauge-900 px-4 py-2 text-white">
          <Link href="/">
            <Wordmark />
          </Link>
          <div className="flex min-w-0 items-center gap-3">
            <span className="truncate text-xs text-gauge-300" data-testid="time-zone-note">
              {zone}
            </span>
            <MobileMenu
              items={nav}
              footer={
                <>
                  {who(false)}
                  <SignOutButton />
                </>
              }
            />
          </div>
        </header>
      }
    >
      {children}
    </ShellFrame>
  );
}
