import { describe, expect, it } from "vitest";
import { methodTable } from "./allowed-methods";

const table = methodTable([
  { method: "get", path: "/api/v1/me" },
  { method: "post", path: "/api/v1/me/password" },
  { method: "get", path: "/api/v1/boards/{boardId}/members" },
  { method: "patch", path: "/api/v1/boards/{boardId}/members/{memberId}" },
  { method: "delete", path: "/api/v1/boards/{boardId}/members/{memberId}" },
]);

describe("methodTable", () => {
  it("lists a path's methods, with HEAD beside GET and OPTIONS always", () => {
    expect(table.allowed("/api/v1/me")).toEqual(["GET", "HEAD", "OPTIONS"]);
    expect(table.allowed("/api/v1/me/")).toEqual(["GET", "HEAD", "OPTIONS"]);
    expect(table.allowed("/api/v1/boards/abc/members/xyz")).toEqual(["DELETE", "OPTIONS", "PATCH"]);
  });

  it("says null for paths no route has", () => {
    expect(table.allowed("/api/v1/nope")).toBeNull();
    expect(table.allowed("/api/v1/boards/abc")).toBeNull();
    expect(table.allowed("/api/v1/boards//members")).toBeNull();
  });
});
