import { StatusPage } from "@/components/layout/status-page";

export default function SignedInNotFound() {
  return (
    <StatusPage code="Not found" title="Nothing here">
      <p>
        This vessel, unit or inspection does not exist, or it belongs to a vessel you are not assigned to. Check the link,
        or find it from the fleet.
      </p>
    </StatusPage>
  );
}
