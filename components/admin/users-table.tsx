"use client";

import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getSortedRowModel,
  useReactTable,
  type FilterFn,
  type SortingState,
} from "@tanstack/react-table";
import Link from "next/link";
import { useMemo, useState } from "react";
import { Input, Select } from "@/components/ui/field";
import { ROLE_LABELS, ROLES, type Role } from "@/lib/auth/roles";
import { cn } from "@/lib/utils";
import { ActivationButton } from "./activation-button";

export type UserTableRow = {
  id: string;
  name: string;
  email: string;
  role: Role | null;
  active: boolean;
  vessels: { id: number; name: string }[];
  lastActiveAt: string | null;
};

const col = createColumnHelper<UserTableRow>();

const matches: FilterFn<UserTableRow> = (row, _id, value: string) => {
  const q = value.trim().toLowerCase();
  if (!q) return true;
  const u = row.original;
  return [u.name, u.email, u.role ? ROLE_LABELS[u.role] : "", ...u.vessels.map((v) => v.name)].some((s) => s.toLowerCase().includes(q));
};

function when(iso: string | null): string {
  if (!iso) return "never";
  return iso.slice(0, 10);
}

export function UsersTable({ users, currentUserId }: { users: UserTableRow[]; currentUserId: string }) {
  const [sorting, setSorting] = useState<SortingState>([{ id: "name", desc: false }]);
  const [search, setSearch] = useState("");
  const [role, setRole] = useState<"" | Role>("");
  const [showInactive, setShowInactive] = useState(true);

  const data = useMemo(
    () => users.filter((u) => (!role || u.role === role) && (showInactive || u.active)),
    [users, role, showInactive],
  );

  const columns = useMemo(
    () => [
      col.accessor("name", {
        header: "Name",
        cell: (c) => (
          <div className="min-w-0">
            <Link href={`/admin/users/${c.row.original.id}`} className="font-medium text-signal hover:underline">
              {c.getValue()}
            </Link>
            <div className="break-all text-xs text-ink-faint">{c.row.original.email}</div>
            <div className="mt-0.5 text-xs text-ink-soft md:hidden">
              {c.row.original.role ? ROLE_LABELS[c.row.original.role] : "No role"}
              {c.row.original.vessels.length ? ` · ${c.row.original.vessels.map((v) => v.name).join(", ")}` : ""}
              {c.row.original.active ? null : <span className="block font-medium">⊘ Deactivated</span>}
            </div>
          </div>
        ),
      }),
      col.accessor((u) => (u.role ? ROLE_LABELS[u.role] : ""), { id: "role", header: "Role", meta: { hideOnPhone: true } }),
      col.accessor((u) => (u.role === "admin" ? "All (admin)" : u.vessels.map((v) => v.name).join(", ")), {
        id: "vessels",
        header: "Vessels",
        meta: { hideOnPhone: true },
        cell: (c) => c.getValue() || <span className="text-limit">none — sees nothing</span>,
      }),
      col.accessor("active", {
        header: "Status",
        meta: { hideOnPhone: true },
        cell: (c) =>
          c.getValue() ? (
            <span className="text-steady">Active</span>
          ) : (
            <span className="inline-flex items-center gap-1 font-medium text-ink-soft">
              <span aria-hidden="true">⊘</span> Deactivated
            </span>
          ),
      }),
      col.accessor("lastActiveAt", {
        header: "Last active",
        meta: { hideOnPhone: true },
        sortUndefined: "last",
        cell: (c) => <span className="num">{when(c.getValue())}</span>,
      }),
      col.display({
        id: "actions",
        header: () => <span className="sr-only">Actions</span>,
        cell: (c) =>
          c.row.original.id === currentUserId ? (
            <span className="text-xs text-ink-faint">you</span>
          ) : (
            <ActivationButton userId={c.row.original.id} name={c.row.original.name} active={c.row.original.active} />
          ),
      }),
    ],
    [currentUserId],
  );

  const table = useReactTable({
    data,
    columns,
    state: { sorting, globalFilter: search },
    onSortingChange: setSorting,
    onGlobalFilterChange: setSearch,
    globalFilterFn: matches,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
  });

  const rows = table.getRowModel().rows;
  return (
    <div>
      <div className="mb-3 grid gap-3 sm:grid-cols-[1fr_14rem_auto] sm:items-end">
        <div>
          <label htmlFor="user-search" className="block text-sm font-medium text-ink-soft">Search</label>
          <Input id="user-search" type="search" placeholder="Name, address, role or vessel" value={search} onChange={(e) => setSearch(e.target.value)} className="mt-1" />
        </div>
        <div>
          <label htmlFor="user-role" className="block text-sm font-medium text-ink-soft">Role</label>
          <Select id="user-role" value={role} onChange={(e) => setRole(e.target.value as "" | Role)} className="mt-1">
            <option value="">All roles</option>
            {ROLES.map((r) => (
              <option key={r} value={r}>{ROLE_LABELS[r]}</option>
            ))}
          </Select>
        </div>
        <label className="flex min-h-11 items-center gap-2 text-sm">
          <input type="checkbox" className="h-5 w-5 accent-signal" checked={showInactive} onChange={(e) => setShowInactive(e.target.checked)} />
          Show deactivated
        </label>
      </div>
      <div className="relative overflow-x-auto rounded-lg border border-ink-line bg-paper-raised">
        <table className="w-full text-sm">
          <thead className="bg-paper-sunk text-left text-xs uppercase tracking-wide text-ink-soft">
            {table.getHeaderGroups().map((hg) => (
              <tr key={hg.id}>
                {hg.headers.map((h) => {
                  const hide = (h.column.columnDef.meta as { hideOnPhone?: boolean } | undefined)?.hideOnPhone;
                  const sorted = h.column.getIsSorted();
                  return (
                    <th
                      key={h.id}
                      scope="col"
                      aria-sort={sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : undefined}
                      className={cn("px-3 py-2", hide && "hidden md:table-cell")}
                    >
                      {h.column.getCanSort() && h.column.id !== "actions" ? (
                        <button type="button" onClick={h.column.getToggleSortingHandler()} className="inline-flex min-h-8 items-center gap-1 uppercase hover:text-ink">
                          {flexRender(h.column.columnDef.header, h.getContext())}
                          <span aria-hidden="true" className="text-ink-faint">{sorted === "asc" ? "▲" : sorted === "desc" ? "▼" : "↕"}</span>
                        </button>
                      ) : (
                        flexRender(h.column.columnDef.header, h.getContext())
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody className="divide-y divide-ink-line/70">
            {rows.length === 0 ? (
              <tr>
                <td colSpan={6} className="px-3 py-6 text-center text-ink-soft">No user matches.</td>
              </tr>
            ) : (
              rows.map((r) => (
                <tr key={r.id} className={cn(!r.original.active && "bg-paper-sunk/60")}>
                  {r.getVisibleCells().map((c) => {
                    const hide = (c.column.columnDef.meta as { hideOnPhone?: boolean } | undefined)?.hideOnPhone;
                    return (
                      <td key={c.id} className={cn("px-3 py-2.5 align-middle", hide && "hidden md:table-cell", c.column.id === "actions" && "text-right")}>
                        {flexRender(c.column.columnDef.cell, c.getContext())}
                      </td>
                    );
                  })}
                </tr>
              ))
            )}
          </tbody>
        </table>
      </div>
      <p className="mt-2 text-xs text-ink-faint">
        <span className="num">{rows.length}</span> of <span className="num">{users.length}</span> users shown
      </p>
    </div>
  );
}
