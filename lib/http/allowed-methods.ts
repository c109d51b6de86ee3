/**
 * Which HTTP methods an /api/v1 path allows, from the OpenAPI operation list (whose match
 * with the route handlers on disk the authorization matrix test enforces). Used by proxy.ts
 * to answer a wrong method with a JSON 405 and an Allow header. Pure.
 */

export interface MethodTable {
  /** Allowed methods, upper case, for a concrete path; null when no route has this path. */
  allowed(pathname: string): string[] | null;
}

export function methodTable(operations: readonly { method: string; path: string }[]): MethodTable {
  const templates = new Map<string, Set<string>>();
  for (const op of operations) {
    const set = templates.get(op.path) ?? new Set<string>();
    set.add(op.method.toUpperCase());
    templates.set(op.path, set);
  }
  const compiled = [...templates].map(([template, methods]) => ({
    segments: template.split("/").filter(Boolean),
    methods,
  }));
  return {
    allowed(pathname) {
      const parts = pathname.replace(/\/+$/, "").split("/").filter(Boolean);
      const found = new Set<string>();
      let matched = false;
      for (const { segments, methods } of compiled) {
        if (segments.length !== parts.length) continue;
        if (!segments.every((s, i) => (s.startsWith("{") && s.endsWith("}") ? parts[i]!.length > 0 : s === parts[i]))) continue;
        matched = true;
        for (const m of methods) found.add(m);
      }
      if (!matched) return null;
      // Next answers HEAD with the GET handler and OPTIONS itself.
      if (found.has("GET")) found.add("HEAD");
      found.add("OPTIONS");
      return [...found].sort();
    },
  };
}
