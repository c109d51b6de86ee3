/**
 * Cross-site write protection for /api/v1 (issue 17, finding 3). A page on another origin of
 * the same site (the object store on another port, say) can make a browser send the user's
 * cookies with "simple" requests: text/plain, form or multipart bodies, or a bodyless type.
 * Writes therefore need an application/json body (or none), and a request a browser marks as
 * coming from another origin (Origin, Sec-Fetch-Site) is refused. Clients that are not
 * browsers send neither header and are not affected. Pure: used by proxy.ts, unit tested.
 */

export const SAFE_METHODS = new Set(["GET", "HEAD", "OPTIONS"]);

export interface CrossSiteRefusal {
  status: 403 | 415;
  error: string;
}

interface RequestFacts {
  method: string;
  pathname: string;
  headers: { get(name: string): string | null };
  /**
   * The app's own origins: APP_URL's, and the one this request was addressed to (its Host),
   * which a page on another origin cannot make a browser send as its Origin.
   */
  appOrigin: string | string[];
}

/** Paths that take a non-JSON body. None today: uploads go straight to the object store by presigned PUT. */
const NON_JSON_BODY_PATHS: RegExp[] = [];

function originOf(value: string): string | null {
  try {
    return new URL(value).origin;
  } catch {
    return null;
  }
}

export function crossSiteRefusal({ method, pathname, headers, appOrigin }: RequestFacts): CrossSiteRefusal | null {
  const verb = method.toUpperCase();
  if (SAFE_METHODS.has(verb)) return null;
  const apps = (Array.isArray(appOrigin) ? appOrigin : [appOrigin]).map(originOf).filter((o): o is string => o !== null);
  const origin = headers.get("origin");
  if (origin !== null && (origin === "null" || !apps.includes(originOf(origin) ?? ""))) {
    return { status: 403, error: `Writes to the VisViva API are accepted only from ${apps[0] ?? "the app's own pages"}; this request came from ${origin}.` };
  }
  const fetchSite = headers.get("sec-fetch-site");
  if (fetchSite !== null && fetchSite !== "same-origin" && fetchSite !== "none") {
    return { status: 403, error: "Writes to the VisViva API are accepted only from the app's own pages (this request came from another site or origin)." };
  }
  if (NON_JSON_BODY_PATHS.some((p) => p.test(pathname))) return null;
  const type = (headers.get("content-type") ?? "").split(";")[0]!.trim().toLowerCase();
  const length = headers.get("content-length");
  const hasBody = headers.get("transfer-encoding") !== null || (length !== null && length !== "0");
  if (type === "application/json") return null;
  if (type === "" && !hasBody) return null;
  return {
    status: 415,
    error: `Send the request body as JSON with "Content-Type: application/json"${type ? ` (this one was ${type})` : ""}. The routes are listed at /api/v1/openapi.json.`,
  };
}
