import { readdirSync, readFileSync, statSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";

function sources(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) return sources(path);
    return path.endsWith(".tsx") ? [path] : [];
  });
}
const files = [...sources("app"), ...sources("components")];

describe("links and prefetching", () => {
  it("a link to an API route or a download is a plain <a>: the router's prefetch of one never settles", () => {
    const offenders = files.filter((file) =>
      /<(Link|IntentLink)\b[^>]*href=\{?["'`]\/api\//.test(readFileSync(file, "utf8")),
    );
    expect(offenders).toEqual([]);
  });

  it("the menus prefetch a page on intent (hover, focus, touch), not every link at load", () => {
    for (const file of [
      "components/shell/app-nav.tsx",
      "components/shell/sub-nav.tsx",
      "components/shell/user-menu.tsx",
      "app/(app)/layout.tsx",
    ]) {
      const text = readFileSync(file, "utf8");
      expect(text, file).not.toMatch(/from "next\/link"/);
      expect(text, file).toMatch(/IntentLink/);
    }
    expect(readFileSync("components/ui/intent-link.tsx", "utf8")).toMatch(/prefetch=\{false\}/);
  });
});
