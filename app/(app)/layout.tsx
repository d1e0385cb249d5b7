import type { ReactNode } from "react";
import { IntentLink } from "@/components/ui/intent-link";
import { Logo } from "@/components/brand/logo";
import { Providers } from "@/components/providers";
import { AppNav } from "@/components/shell/app-nav";
import { NAV_ITEMS } from "@/components/shell/nav-items";
import { UserMenu } from "@/components/shell/user-menu";
import { can } from "@/lib/auth/permissions";
import { requirePageUser } from "@/lib/server/auth/current-user";

export default async function AppLayout({ children }: { children: ReactNode }) {
  // The real checks are in every page, action and route handler; this only builds the shell.
  const user = await requirePageUser(undefined, { allowPasswordChange: true });
  const items = user.mustChangePassword
    ? []
    : NAV_ITEMS.filter((item) => can(user.roles, item.permission));
  return (
    <div className="min-h-screen">
      <a
        href="#main"
        className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:rounded focus:bg-white focus:px-3 focus:py-2"
      >
        Skip to content
      </a>
      <header className="sticky top-0 z-10 flex items-center justify-between border-b border-stone-200 bg-white/95 px-4 py-2 backdrop-blur lg:px-6">
        <IntentLink href="/" aria-label="Washproof home">
          <Logo />
        </IntentLink>
        <UserMenu name={user.name} roles={user.roles} />
      </header>
      <div className="mx-auto flex max-w-[1600px] flex-col gap-6 px-4 py-6 lg:flex-row lg:px-6">
        {items.length > 0 && (
          <aside className="lg:w-56 lg:shrink-0">
            <AppNav items={items} />
          </aside>
        )}
        <main id="main" className="min-w-0 flex-1">
          <Providers>{children}</Providers>
        </main>
      </div>
    </div>
  );
}
