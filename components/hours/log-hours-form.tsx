"use client";

import { useActionState, useState } from "react";
import { Button } from "@/components/ui/button";
import { FieldError, Input, Label } from "@/components/ui/field";
import { FormMessage } from "@/components/ui/form-message";
import { initialActionState, type ActionState } from "@/lib/auth/action-state";

type Action = (prev: ActionState | undefined, input: FormData) => Promise<ActionState>;

/** The chief's counter reading: date and running hours, kept as typed when refused. */
export function LogHoursForm({ engineId, action, today }: { engineId: number; action: Action; today: string }) {
  const [state, formAction, pending] = useActionState(action, initialActionState);
  const [loggedOn, setLoggedOn] = useState(today);
  const [engineHours, setEngineHours] = useState("");
  const err = (k: string) => state.fieldErrors[k];
  return (
    <form
      action={(fd) => {
        formAction(fd);
      }}
      className="space-y-3"
      noValidate
    >
      <input type="hidden" name="engineId" value={engineId} />
      <div className="grid grid-cols-2 gap-3">
        <div>
          <Label htmlFor="loggedOn">Date</Label>
          <Input id="loggedOn" name="loggedOn" type="date" value={loggedOn} onChange={(e) => setLoggedOn(e.target.value)} aria-invalid={!!err("loggedOn")} className="mt-1" />
          <FieldError messages={err("loggedOn")} />
        </div>
        <div>
          <Label htmlFor="engineHours">Counter, h</Label>
          <Input
            id="engineHours"
            name="engineHours"
            inputMode="decimal"
            autoComplete="off"
            value={engineHours}
            onChange={(e) => setEngineHours(e.target.value)}
            aria-invalid={!!err("engineHours")}
            className="num mt-1"
            placeholder="e.g. 64210"
          />
          <FieldError messages={err("engineHours")} />
        </div>
      </div>
      <FormMessage ok={state.ok} message={state.message} />
      <Button type="submit" disabled={pending}>
        {pending ? "Logging…" : "Log running hours"}
      </Button>
    </form>
  );
}
