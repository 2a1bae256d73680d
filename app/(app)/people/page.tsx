import type { Metadata } from "next";
import { InviteForm } from "@/components/people/invite-form";
import { PeopleTable } from "@/components/people/people-table";
import { WorkspaceSettingsForm } from "@/components/people/workspace-settings-form";
import { requirePageUser } from "@/lib/auth/require-user";

export const metadata: Metadata = { title: "People" };

export default async function PeoplePage() {
  const user = await requirePageUser({ role: "lead", from: "/people" });
  return (
    <div className="max-w-5xl space-y-6">
      <div>
        <h1 className="page-title">People</h1>
        <p className="text-gauge-700">Everyone in {user.workspaceName}. Roles take effect on the person&rsquo;s next request; deactivation ends their sessions.</p>
      </div>
      <WorkspaceSettingsForm timeZone={user.timeZone} />
      <InviteForm />
      <PeopleTable currentUserId={user.id} />
    </div>
  );
}
