"use client";

import { useActionState, useState } from "react";
import { Button } from "@/components/ui/button";
import { FormMessage } from "@/components/ui/form-message";
import { initialActionState, type ActionState } from "@/lib/auth/action-state";
import { TOPIC_INFO, type Topic } from "@/lib/notifications/topics";

type Action = (prev: ActionState | undefined, input: FormData) => Promise<ActionState>;

/** One switch per kind of e-mail; what was ticked stays ticked when the save is refused. */
export function PreferencesForm({ action, preferences }: { action: Action; preferences: { topic: Topic; enabled: boolean }[] }) {
  const [state, formAction, pending] = useActionState(action, initialActionState);
  const [on, setOn] = useState<Set<Topic>>(() => new Set(preferences.filter((p) => p.enabled).map((p) => p.topic)));
  const toggle = (t: Topic, checked: boolean) =>
    setOn((prev) => {
      const next = new Set(prev);
      if (checked) next.add(t);
      else next.delete(t);
      return next;
    });
  return (
    <form action={formAction} className="space-y-4">
      <fieldset>
        <legend className="mb-2 text-sm font-medium text-ink-soft">Send me an e-mail when…</legend>
        <ul className="divide-y divide-ink-line/70 rounded-lg border border-ink-line bg-paper-raised">
          {preferences.map(({ topic }) => (
            <li key={topic}>
              <label className="flex min-h-14 cursor-pointer items-start gap-3 px-4 py-3">
                <input
                  type="checkbox"
                  name="topics[]"
                  value={topic}
                  checked={on.has(topic)}
                  onChange={(e) => toggle(topic, e.target.checked)}
                  className="mt-0.5 h-6 w-6 shrink-0 accent-signal"
                  aria-describedby={`hint-${topic}`}
                />
                <span className="min-w-0">
                  <span className="block font-medium">{TOPIC_INFO[topic].label}</span>
                  <span id={`hint-${topic}`} className="block text-sm text-ink-soft">
                    {TOPIC_INFO[topic].hint}
                  </span>
                </span>
              </label>
            </li>
          ))}
        </ul>
      </fieldset>
      <FormMessage ok={state.ok} message={state.message} />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" disabled={pending}>
          {pending ? "Saving…" : "Save my choices"}
        </Button>
        <Button type="button" variant="secondary" onClick={() => setOn(new Set())} disabled={pending}>
          Untick all
        </Button>
      </div>
    </form>
  );
}
