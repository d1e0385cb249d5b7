"use client";

import { useEffect, useRef } from "react";

/**
 * Put inside a GET filter form whose page shows what the form chose. When the browser brings the
 * page back from its history (Back, Forward), the fields are set back to what this page shows:
 * the browser would otherwise keep the choice made just before leaving, beside a chart of the
 * choice before it.
 */
export function ShowsItsPage() {
  const marker = useRef<HTMLSpanElement>(null);
  useEffect(() => {
    const onShow = (event: PageTransitionEvent) => {
      if (!event.persisted) return;
      const form = marker.current?.closest("form");
      if (!form) return;
      form.reset();
      for (const field of form.querySelectorAll<HTMLSelectElement>("select:disabled"))
        field.disabled = false;
    };
    window.addEventListener("pageshow", onShow);
    return () => window.removeEventListener("pageshow", onShow);
  }, []);
  return <span ref={marker} hidden />;
}
