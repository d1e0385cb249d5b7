import { CircleCheck, CircleSlash, KeyRound, Lock } from "lucide-react";

/** Status as a word with an icon, never colour alone. */
export function UserStatus({
  active,
  locked,
  mustChangePassword,
}: {
  active: boolean;
  locked: boolean;
  mustChangePassword: boolean;
}) {
  if (!active)
    return (
      <span className="inline-flex items-center gap-1 text-stone-600">
        <CircleSlash className="h-4 w-4" aria-hidden="true" /> Deactivated
      </span>
    );
  if (locked)
    return (
      <span className="inline-flex items-center gap-1 text-red-800">
        <Lock className="h-4 w-4" aria-hidden="true" /> Locked
      </span>
    );
  if (mustChangePassword)
    return (
      <span className="inline-flex items-center gap-1 text-caution-700">
        <KeyRound className="h-4 w-4" aria-hidden="true" /> Temporary password
      </span>
    );
  return (
    <span className="inline-flex items-center gap-1 text-brand-700">
      <CircleCheck className="h-4 w-4" aria-hidden="true" /> Active
    </span>
  );
}
