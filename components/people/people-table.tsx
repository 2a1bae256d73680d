"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { createColumnHelper, flexRender, getCoreRowModel, getSortedRowModel, useReactTable, type SortingState, type Updater } from "@tanstack/react-table";
import { useMemo, useState } from "react";
import { FormMessage } from "@/components/ui/form-field";
import { useListParams } from "@/components/ui/use-list-params";
import { ROLE_LABELS, ROLES, type Role } from "@/lib/auth/roles";
import { apiFetch } from "@/lib/http/client";
import { PEOPLE_SORTS, peopleListParamsSchema } from "@/lib/people/list-params";
import { peopleKeys } from "@/lib/query-keys/people";

type Person = { id: string; email: string; name: string; roles: Role[]; active: boolean; hasPassword: boolean; lastSignInAt: string | null; invitationEmail: "sent" | "queued" | "failed" | null };

const column = createColumnHelper<Person>();

function status(p: Person) {
  if (!p.active) return "Deactivated";
  if (p.hasPassword) return "Active";
  if (p.invitationEmail === "queued") return "Invited (e-mail pending: the mail server has not taken it yet)";
  if (p.invitationEmail === "failed") return "Invited (e-mail not delivered: resend it)";
  return "Invited";
}

export function PeopleTable({ currentUserId }: { currentUserId: string }) {
  const queryClient = useQueryClient();
  // The sort is in the URL (back and a shared link keep it); the rows are sorted here.
  const { params, go } = useListParams(peopleListParamsSchema);
  // The same array between renders: a new one re-sorts the rows on every render, and TanStack Table
  // then resets its page index after each sort, which renders again — after a click (a synchronous
  // update) that loop froze the page (accounts.spec: invite someone, then open the Outbox).
  const sorting: SortingState = useMemo(() => [{ id: params.sort, desc: params.dir === "desc" }], [params.sort, params.dir]);
  const setSorting = (updater: Updater<SortingState>) => {
    const next = (typeof updater === "function" ? updater(sorting) : updater)[0];
    if (next && (PEOPLE_SORTS as readonly string[]).includes(next.id)) go({ sort: next.id as (typeof PEOPLE_SORTS)[number], dir: next.desc ? "desc" : "asc" });
  };
  const [message, setMessage] = useState<{ kind: "error" | "success"; text: string } | null>(null);
  const people = useQuery({ queryKey: peopleKeys.list(), queryFn: () => apiFetch<{ people: Person[] }>("/api/people").then((d) => d.people) });

  const update = useMutation({
    mutationFn: ({ id, body }: { id: string; body: Partial<Pick<Person, "roles" | "active">> }) => apiFetch(`/api/people/${id}`, { method: "PATCH", body }),
    onSuccess: () => {
      setMessage({ kind: "success", text: "Saved." });
      void queryClient.invalidateQueries({ queryKey: peopleKeys.all });
    },
    onError: (err) => setMessage({ kind: "error", text: err.message }),
  });
  const resend = useMutation({
    mutationFn: (id: string) => apiFetch<{ message: string }>(`/api/people/${id}/invitation`, { method: "POST" }),
    onSuccess: (d) => setMessage({ kind: "success", text: d.message }),
    onError: (err) => setMessage({ kind: "error", text: err.message }),
  });

  const columns = useMemo(
    () => [
      column.accessor("name", { header: "Name" }),
      column.accessor("email", { header: "E-mail" }),
      column.accessor("roles", {
        header: "Roles",
        enableSorting: false,
        cell: ({ row }) => (
          <div className="flex flex-wrap gap-3" role="group" aria-label={`Roles of ${row.original.name}`}>
            {ROLES.map((role) => {
              const checked = row.original.roles.includes(role);
              return (
                <label key={role} className="flex items-center gap-1 text-xs">
                  <input
                    type="checkbox"
                    checked={checked}
                    disabled={update.isPending}
                    onChange={() => {
                      const roles = checked ? row.original.roles.filter((r) => r !== role) : [...row.original.roles, role];
                      update.mutate({ id: row.original.id, body: { roles } });
                    }}
                  />
                  {ROLE_LABELS[role]}
                </label>
              );
            })}
          </div>
        ),
      }),
      column.accessor((p) => status(p), { id: "status", header: "Status" }),
      column.display({
        id: "actions",
        header: () => <span className="sr-only">Actions</span>,
        cell: ({ row }) => {
          const p = row.original;
          return (
            <div className="flex justify-end gap-2">
              {p.active && !p.hasPassword && (
                <button type="button" className="btn-secondary py-1 text-xs" onClick={() => resend.mutate(p.id)}>
                  Resend invitation
                </button>
              )}
              {p.id !== currentUserId && (
                <button type="button" className={p.active ? "btn-danger py-1 text-xs" : "btn-secondary py-1 text-xs"} onClick={() => update.mutate({ id: p.id, body: { active: !p.active } })}>
                  {p.active ? "Deactivate" : "Reactivate"}
                </button>
              )}
            </div>
          );
        },
      }),
    ],
    [currentUserId, update, resend],
  );

  const table = useReactTable({
    data: people.data ?? [],
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    enableSortingRemoval: false,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });

  if (people.isPending) return <p className="text-sm text-gauge-600">Loading people…</p>;
  if (people.isError) return <FormMessage kind="error">{people.error.message}</FormMessage>;

  return (
    <div className="space-y-3">
      {message && <FormMessage kind={message.kind}>{message.text}</FormMessage>}
      <div className="card overflow-x-auto">
        <table className="min-w-full text-sm" data-testid="people-table">
          <thead className="bg-gauge-50 text-left text-xs uppercase tracking-wide text-gauge-600">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                {group.headers.map((header) => (
                  <th key={header.id} scope="col" className="px-4 py-2 font-medium">
                    {header.column.getCanSort() ? (
                      <button type="button" onClick={header.column.getToggleSortingHandler()} className="uppercase">
                        {flexRender(header.column.columnDef.header, header.getContext())}
                        {{ asc: " ↑", desc: " ↓" }[header.column.getIsSorted() as string] ?? ""}
                      </button>
                    ) : (
                      flexRender(header.column.columnDef.header, header.getContext())
                    )}
                  </th>
                ))}
              </tr>
            ))}
          </thead>
          <tbody className="divide-y divide-gauge-100">
            {table.getRowModel().rows.map((row) => (
              <tr key={row.id} data-testid={`person-${row.original.email}`}>
                {row.getVisibleCells().map((cell) => (
                  <td key={cell.id} className="px-4 py-2 align-top">
                    {flexRender(cell.column.columnDef.cell, cell.getContext())}
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}
