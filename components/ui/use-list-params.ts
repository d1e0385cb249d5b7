"use client";

import { usePathname, useSearchParams } from "next/navigation";
import { useCallback, useMemo, useRef } from "react";
import { listSearch, readListParams, type ListState } from "@/lib/url/list-params";

/**
 * How a change reaches the browser's history. A choice (a select, a sort, a page) is a step Back
 * undoes. Typing is one step for the whole of what is typed into one field: its first keystroke
 * adds the step, the rest replace it. A correction (an address the list cannot use, a page past
 * the end) replaces the address without a step.
 */
export type ListChange = "step" | "typing" | "correction";

/**
 * A client list's filters, sort and page, kept in the address through the History API, which
 * Next keeps in step with useSearchParams without asking the server for the page again.
 */
export function useListParams<T extends ListState>(
  defaults: T,
): [T, (patch: Partial<T>, change?: ListChange) => void] {
  const search = useSearchParams();
  const pathname = usePathname();
  // `defaults` is a module constant at every call site; its keys decide what is read.
  // eslint-disable-next-line react-hooks/exhaustive-deps
  const state = useMemo(() => readListParams(search, defaults), [search]);
  // The fields of the typing that made the current step, while it goes on.
  const typingIn = useRef<string | null>(null);
  const update = useCallback(
    (patch: Partial<T>, change: ListChange = "step") => {
      const next = {
        ...readListParams(new URLSearchParams(window.location.search), defaults),
        ...patch,
      } as T;
      const url = `${pathname}${listSearch(next, defaults)}`;
      if (url === `${pathname}${window.location.search}`) return;
      const fields = Object.keys(patch).sort().join(",");
      const replace =
        change === "correction" || (change === "typing" && typingIn.current === fields);
      if (change !== "correction") typingIn.current = change === "typing" ? fields : null;
      if (replace) window.history.replaceState(null, "", url);
      else window.history.pushState(null, "", url);
    },
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [pathname],
  );
  return [state, update];
}
