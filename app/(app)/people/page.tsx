import type { Metadata } from "next";
import { InviteForm } from "@/components/people/invite-form";
import { PeopleTable } from "@/components/people/people-table";
import { WorkspaceSettingsForm } from "@/components/people/workspace-settings-form";
import { EmptyState } from "@/components/ui/empty-state";
import { getSetupCounts } from "@/db/queries/workspaces";
import { requirePageUser } from "@/lib/auth/require-user";

export const metadata: Metadata = { title: "People" };

export default async function PeoplePage() {
  const user = await requirePageUser({ permission: "people.manage", from: "/people" });
  const counts = await getSetupCounts({ workspaceId: user.workspaceId });
  return (
    <div className="max-w-5xl space-y-6">
      <div>
        <h1 className="page-title">People</h1>
        <p className="text-gauge-700">Everyone in {user.workspaceName}. Roles take effect on the person&rsquo;s next request; deactivation ends their sessions.</p>
      </div>
      {counts.people <= 1 && (
        <EmptyState title="Only you so far" testId="people-empty">
          Invite your inspectors, trainers and auditors below: each receives an e-mail with a link to set a password. Check the workspace&apos;s time zone first; every time in Partproof is shown in
          it.
        </EmptyState>
      )}
      <WorkspaceSettingsForm timeZone={user.timeZone} />
      <InviteForm />
      <PeopleTable currentUserId={user.id} />
    </div>
  );
}
