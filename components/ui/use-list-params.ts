"use client";

import { usePathname, useSearchParams } from "next/navigation";
import { useCallback, useMemo } from "react";
import { listSearch, readListParams, type ListState } from "@/lib/url/list-params";

/**
 * A client list's filters, sort and page, kept in the address. The URL is replaced through the
 * History API, which Next keeps in step with useSearchParams without asking the server for the
 * page again; Back does not step through every filter change.
 */
export function useListParams<T extends ListState>(defaults: T): [T, (patch: Partial<T>) => void] {
  const search = useSearchParams();
  const pathname = usePathname();
  // `defaults` is a module constant at every call site; its keys decide what is read.
  // eslint-disable-next-line react-hooks/exhaustive-deps
  const state = useMemo(() => readListParams(search, defaults), [search]);
  const update = useCallback(
    (patch: Partial<T>) => {
      const next = {
        ...readListParams(new URLSearchParams(window.location.search), defaults),
        ...patch,
      } as T;
      window.history.replaceState(null, "", `${pathname}${listSearch(next, defaults)}`);
    },
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [pathname],
  );
  return [state, update];
}
