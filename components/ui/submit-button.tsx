"use client";

import { Button, type ButtonProps } from "./button";
import { useFormResult } from "./action-form";

export function SubmitButton({
  children,
  pendingText,
  ...props
}: ButtonProps & { pendingText?: string }) {
  const { pending } = useFormResult();
  return (
    <Button type="submit" disabled={pending} aria-disabled={pending} {...props}>
      {pending ? (pendingText ?? "Working…") : children}
    </Button>
  );
}
