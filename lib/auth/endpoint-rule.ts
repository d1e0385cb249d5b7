import type { Permission } from "./permissions";

/**
 * Who may call an endpoint, declared once with the endpoint itself:
 * - public: anyone, signed in or not (signing in and out, the API description);
 * - session: a signed-in user whose role has `permission` (server actions and /api routes);
 *   `when` names an input field whose value switches to another permission (signing a run as
 *   performed needs a different permission than verifying it);
 * - token: a bearer API token whose owner's role has `permission`, and whose scope is at
 *   least `scope` (/api/v1).
 */
export type EndpointRule =
  | { auth: "public" }
  | { auth: "session"; permission: Permission; when?: PermissionSwitch }
  | { auth: "token"; permission: Permission; scope: "read" | "read_write" };

export interface PermissionSwitch {
  field: string;
  value: string;
  permission: Permission;
}

/** The property every endpoint function carries, read by the registry (lib/auth/endpoints.ts). */
export const ENDPOINT_RULE = "endpointRule";

export type Declared<F> = F & { readonly [ENDPOINT_RULE]: EndpointRule };

/** Attaches the rule to the function the framework calls, so the endpoint and its rule cannot drift. */
export function declareEndpoint<F extends (...args: never[]) => unknown>(
  fn: F,
  rule: EndpointRule,
): Declared<F> {
  Object.defineProperty(fn, ENDPOINT_RULE, { value: rule, enumerable: false });
  return fn as Declared<F>;
}

export function ruleOf(fn: unknown): EndpointRule | undefined {
  return typeof fn === "function"
    ? ((fn as unknown as Record<string, unknown>)[ENDPOINT_RULE] as EndpointRule | undefined)
    : undefined;
}

/** The permission a call needs: the switched one when the switching field holds its value. */
export function permissionFor(
  rule: { permission: Permission; when?: PermissionSwitch },
  read: (field: string) => unknown,
): Permission {
  return rule.when && read(rule.when.field) === rule.when.value
    ? rule.when.permission
    : rule.permission;
}

const METHODS = ["GET", "POST", "PUT", "PATCH", "DELETE"] as const;

/**
 * The rules declared by the endpoints of some modules, keyed as the registry names them:
 * "<file>#<export>" for actions, "<METHOD> <file>" for route handlers. An export with no
 * declaration is left out, so the registry test names it as undeclared.
 */
export function rulesOf(
  modules: Record<string, Record<string, unknown>>,
): Record<string, EndpointRule> {
  const out: Record<string, EndpointRule> = {};
  for (const [file, mod] of Object.entries(modules)) {
    const isRoute = file.endsWith("/route.ts");
    for (const [name, fn] of Object.entries(mod)) {
      if (isRoute && !(METHODS as readonly string[]).includes(name)) continue;
      const rule = ruleOf(fn);
      if (rule) out[isRoute ? `${name} ${file}` : `${file}#${name}`] = rule;
    }
  }
  return out;
}
