import { AppShell } from "@/components/shell/app-shell";
import { TimeZoneProvider } from "@/components/ui/time-zone";
import { requirePageUser } from "@/lib/auth/require-user";
import { localInboxDir } from "@/lib/env";
import { screensFor } from "@/lib/nav";

export default async function SignedInLayout({ children }: { children: React.ReactNode }) {
  const user = await requirePageUser();
  const screens = screensFor(user.roles, { outbox: Boolean(localInboxDir()) });
  return (
    <TimeZoneProvider timeZone={user.timeZone}>
      <AppShell user={user} screens={screens}>
        {children}
      </AppShell>
    </TimeZoneProvider>
  );
}
