import { describe, expect, it } from "vitest";
import { AppError, fromDatabaseInputError } from "./errors";

describe("fromDatabaseInputError", () => {
  it("turns PostgreSQL's invalid-text-representation error, bare or wrapped by the ORM, into a 404", () => {
    const pgError = Object.assign(new Error('invalid input syntax for type uuid: "x"'), { code: "22P02" });
    const wrapped = Object.assign(new Error("Failed query"), { cause: pgError });
    for (const error of [pgError, wrapped]) {
      const mapped = fromDatabaseInputError(error);
      expect(mapped).toBeInstanceOf(AppError);
      expect(mapped?.status).toBe(404);
      expect(mapped?.message).not.toContain("uuid");
    }
  });

  it("leaves every other error alone", () => {
    expect(fromDatabaseInputError(Object.assign(new Error("deadlock"), { code: "40P01" }))).toBeNull();
    expect(fromDatabaseInputError(new Error("plain"))).toBeNull();
    expect(fromDatabaseInputError(null)).toBeNull();
  });
});
