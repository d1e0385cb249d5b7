import { IntentLink } from "@/components/ui/intent-link";
import { ROLE_LABELS, type Role } from "@/lib/auth/permissions";
import { signOutAction } from "@/app/(app)/actions";

export function UserMenu({ name, roles }: { name: string; roles: Role[] }) {
  return (
    <details className="group relative">
      <summary className="flex cursor-pointer list-none items-center gap-2 rounded-md px-2 py-1.5 text-sm hover:bg-stone-100">
        <span
          className="flex h-7 w-7 items-center justify-center rounded-full bg-brand-100 text-xs font-semibold text-brand-800"
          aria-hidden="true"
        >
          {name
            .split(" ")
            .map((p) => p[0])
            .slice(0, 2)
            .join("")}
        </span>
        <span className="text-left">
          <span className="block font-medium text-stone-900">{name}</span>
          <span className="block text-xs text-stone-600">
            {roles.map((r) => ROLE_LABELS[r]).join(", ")}
          </span>
        </span>
      </summary>
      <div className="absolute right-0 z-20 mt-1 w-56 rounded-md border border-stone-200 bg-white p-1 shadow-lg">
        <IntentLink
          href="/account/password"
          className="block rounded px-3 py-2 text-sm hover:bg-stone-100"
        >
          Change password
        </IntentLink>
        <IntentLink
          href="/account/tokens"
          className="block rounded px-3 py-2 text-sm hover:bg-stone-100"
        >
          API tokens
        </IntentLink>
        <form action={signOutAction}>
          <button
            type="submit"
            className="block w-full rounded px-3 py-2 text-left text-sm hover:bg-stone-100"
          >
            Sign out
          </button>
        </form>
      </div>
    </details>
  );
}
