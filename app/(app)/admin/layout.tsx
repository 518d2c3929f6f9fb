import { AdminTabs } from "@/components/admin/admin-tabs";

// Navigation only: each admin page checks its own permission (a layout is not a guard).
export default function AdminLayout({ children }: { children: React.ReactNode }) {
  return (
    <>
      <AdminTabs />
      {children}
    </>
  );
}
