import { describe, expect, it } from "vitest";
import { crossSiteRefusal } from "./cross-site";

const app = "http://127.0.0.1:3000";
const check = (method: string, headers: Record<string, string>) =>
  crossSiteRefusal({ method, pathname: "/api/v1/boards/x/invitations", headers: new Headers(headers), appOrigin: app });

describe("cross-site writes on /api/v1 (issue 17, finding 3)", () => {
  it("refuses text/plain, form and multipart bodies and a body without a type", () => {
    for (const type of ["text/plain", "application/x-www-form-urlencoded", "multipart/form-data; boundary=x"]) {
      expect(check("POST", { "content-type": type, "content-length": "10" })?.status).toBe(415);
    }
    expect(check("POST", { "content-length": "10" })?.status).toBe(415);
    expect(check("PATCH", { "content-type": "text/plain;charset=UTF-8", "content-length": "2" })?.status).toBe(415);
  });

  it("accepts JSON bodies and bodiless writes from the app itself or from non-browser clients", () => {
    expect(check("POST", { "content-type": "application/json", "content-length": "2" })).toBeNull();
    expect(check("POST", { "content-type": "application/json; charset=utf-8", origin: app, "sec-fetch-site": "same-origin" })).toBeNull();
    expect(check("POST", {})).toBeNull();
    expect(check("DELETE", { "content-length": "0" })).toBeNull();
    expect(check("GET", { "content-type": "text/plain", origin: "http://evil.example" })).toBeNull();
  });

  it("refuses another origin of the same site (the store on another port) and other sites", () => {
    expect(check("POST", { "content-type": "application/json", origin: "http://127.0.0.1:3001" })?.status).toBe(403);
    expect(check("POST", { "content-type": "application/json", origin: "null" })?.status).toBe(403);
    expect(check("POST", { "content-type": "application/json", "sec-fetch-site": "same-site" })?.status).toBe(403);
    expect(check("DELETE", { "sec-fetch-site": "cross-site" })?.status).toBe(403);
  });
});
