"use client";

import { usePathname, useSearchParams } from "next/navigation";
import { useCallback, useMemo } from "react";
import { listSearch, readListParams, type ListState } from "@/lib/url/list-params";

/**
 * How a change reaches the browser's history: a choice (a select, a sort, a page) is a step Back
 * undoes; typing replaces the address as it goes, so Back does not step through every keystroke.
 */
export type ListChange = "step" | "typing";

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
  const update = useCallback(
    (patch: Partial<T>, change: ListChange = "step") => {
      const next = {
        ...readListParams(new URLSearchParams(window.location.search), defaults),
        ...patch,
      } as T;
      const url = `${pathname}${listSearch(next, defaults)}`;
      if (url === `${pathname}${window.location.search}`) return;
      if (change === "step") window.history.pushState(null, "", url);
      else window.history.replaceState(null, "", url);
    },
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [pathname],
  );
  return [state, update];
}
