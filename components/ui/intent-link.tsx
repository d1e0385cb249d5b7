"use client";

import Link from "next/link";
import { useRouter } from "next/navigation";
import { useRef, type ComponentProps } from "react";

type IntentLinkProps = Omit<ComponentProps<typeof Link>, "prefetch" | "href"> & { href: string };

/**
 * A link that fetches its page when the user shows intent — the pointer over it, keyboard
 * focus, a touch — rather than as soon as it is drawn. Every menu link prefetched at load kept
 * each page busy for more than a second on a shared machine.
 */
export function IntentLink({
  href,
  onMouseEnter,
  onFocus,
  onTouchStart,
  ...props
}: IntentLinkProps) {
  const router = useRouter();
  const fetched = useRef(false);
  const prefetch = () => {
    if (fetched.current) return;
    fetched.current = true;
    router.prefetch(href);
  };
  return (
    <Link
      href={href}
      prefetch={false}
      onMouseEnter={(e) => {
        onMouseEnter?.(e);
        prefetch();
      }}
      onFocus={(e) => {
        onFocus?.(e);
        prefetch();
      }}
      onTouchStart={(e) => {
        onTouchStart?.(e);
        prefetch();
      }}
      {...props}
    />
  );
}
