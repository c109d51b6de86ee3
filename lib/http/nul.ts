/**
 * U+0000 (NUL) in input: PostgreSQL cannot store it in text, so it used to surface as a 500.
 * Every boundary refuses it with a 400 instead (issue 17): proxy.ts for paths and query
 * strings, readJson/parseWith for bodies and parameters, the action wrappers for actions.
 * Pure, so it can be unit tested.
 */
export const NUL_MESSAGE = "The input contains a NUL character (U+0000), which VisViva cannot store. Remove it and try again.";

/** Whether a value (strings, object keys, arrays, FormData entries; nested) holds a NUL. */
export function containsNul(value: unknown): boolean {
  const stack: unknown[] = [value];
  let visited = 0;
  while (stack.length > 0) {
    const v = stack.pop();
    if (++visited > 1_000_000) return false;
    if (typeof v === "string") {
      if (v.includes("\u0000")) return true;
    } else if (Array.isArray(v)) {
      for (const item of v) stack.push(item);
    } else if (typeof FormData !== "undefined" && v instanceof FormData) {
      for (const [key, item] of v.entries()) {
        if (key.includes("\u0000")) return true;
        if (typeof item === "string") stack.push(item);
        else stack.push(item.name);
      }
    } else if (v !== null && typeof v === "object") {
      for (const [key, item] of Object.entries(v)) {
        if (key.includes("\u0000")) return true;
        stack.push(item);
      }
    }
  }
  return false;
}

/**
 * Whether a request path has percent-escapes that do not decode to text (for example
 * %ED%A0%80, a lone surrogate in UTF-8, or a stray %). Next.js would throw decoding them
 * into route parameters (a 500); proxy.ts answers 400 first.
 */
export function pathIsMalformed(pathname: string): boolean {
  for (const segment of pathname.split("/")) {
    try {
      decodeURIComponent(segment);
    } catch {
      return true;
    }
  }
  return false;
}

/** Whether a request URL carries an encoded NUL in its path or query. */
export function urlContainsNul(url: string): boolean {
  return /%00/i.test(url) || url.includes("\u0000");
}
