"use client";

import { Button } from "@/components/ui/button";

/** Opens the browser's print dialog; the print styles keep charts and tables whole and drop the controls. */
export function PrintButton() {
  return (
    <Button type="button" variant="secondary" onClick={() => window.print()}>
      Print
    </Button>
  );
}
