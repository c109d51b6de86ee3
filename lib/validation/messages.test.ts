import { describe, expect, it } from "vitest";
import { z } from "zod";
import { fieldPhrase, humanFieldErrors, humanIssue } from "./messages";

function issues(schema: z.ZodType, value: unknown) {
  const parsed = schema.safeParse(value);
  if (parsed.success) throw new Error("expected the value to be refused");
  return parsed.error.issues;
}

describe("form and API errors as sentences", () => {
  it("turns zod's length limits into sentences with the field's name", () => {
    const [issue] = issues(z.object({ title: z.string().max(200) }), { title: "x".repeat(201) });
    expect(issue!.message).toMatch(/^Too big/);
    expect(humanIssue(issue!)).toBe("The title can be at most 200 characters.");
    expect(humanIssue(issues(z.object({ title: z.string().min(1) }), { title: "" })[0]!)).toBe("Enter the title.");
    expect(humanIssue(issues(z.object({ summary: z.string().min(20) }), { summary: "short" })[0]!)).toBe("The summary needs at least 20 characters.");
    expect(humanIssue(issues(z.object({ levels: z.array(z.string()).min(2) }), { levels: [] })[0]!)).toBe("The levels needs at least 2 entries.");
  });

  it("says what a number, a choice, a format or a missing field needs", () => {
    expect(humanIssue(issues(z.object({ weight: z.number().max(100) }), { weight: 120 })[0]!)).toBe("The weight can be at most 100.");
    expect(humanIssue(issues(z.object({ weight: z.number().gt(0) }), { weight: 0 })[0]!)).toBe("The weight must be more than 0.");
    expect(humanIssue(issues(z.object({ count: z.number().int() }), { count: 1.5 })[0]!)).toBe("The count must be a whole number.");
    expect(humanIssue(issues(z.object({ role: z.enum(["chair", "reviewer"]) }), { role: "boss" })[0]!)).toBe('The role must be one of "chair" or "reviewer".');
    expect(humanIssue(issues(z.object({ email: z.email() }), { email: "nope" })[0]!)).toBe(
      "The e-mail address must be an e-mail address, like name@example.org.",
    );
    expect(humanIssue(issues(z.object({ opensAt: z.iso.datetime() }), { opensAt: "soon" })[0]!)).toBe(
      "The opening time must be a date and time, like 2026-12-02T14:00:00Z.",
    );
    expect(humanIssue(issues(z.object({ title: z.string() }), {})[0]!)).toBe("The title is missing.");
    expect(humanIssue(issues(z.strictObject({ title: z.string() }), { title: "a", colour: "red" })[0]!)).toBe(
      'The field "colour" is not expected; leave it out.',
    );
  });

  it("keeps a schema's own message, naming the field before a fragment", () => {
    expect(humanIssue(issues(z.object({ name: z.string().min(1, "Enter a name.") }), { name: "" })[0]!)).toBe("Enter a name.");
    expect(humanIssue(issues(z.object({ title: z.string().min(1, "needs a title") }), { title: "" })[0]!)).toBe("The title needs a title.");
    expect(humanIssue(issues(z.object({ id: z.string().regex(/^[a-z]+$/, "use lower-case letters") }), { id: "A" })[0]!)).toBe("Use lower-case letters.");
  });

  it("names nested fields by their place in a list", () => {
    expect(fieldPhrase(["criteria", 1, "title"])).toBe("the title of entry 2 in criteria");
    expect(fieldPhrase([])).toBe("the request");
    const schema = z.object({ criteria: z.array(z.object({ title: z.string().max(5) })) });
    expect(humanFieldErrors(issues(schema, { criteria: [{ title: "ok" }, { title: "far too long" }] }))).toEqual({
      "criteria.1.title": ["The title of entry 2 in criteria can be at most 5 characters."],
    });
  });
});
