// zod's own messages ("Too big: expected string to have <=200 characters") turned into
// sentences a person can act on ("The title can be at most 200 characters."). Messages a
// schema wrote itself are kept: fragments ("needs a title") get the field's name in front,
// instructions ("choose a call") become sentences.
// Used by the route wrapper (API 4xx) and the action wrapper (form field errors). Pure.
import type { z } from "zod";

type Issue = z.core.$ZodIssue;
type PathKey = PropertyKey;

/** Field names whose words differ from their split code name. */
const FIELD_WORDS: Record<string, string> = {
  opensAt: "opening time",
  closesAt: "closing time",
  dueAt: "due date",
  email: "e-mail address",
  url: "web address",
  missionType: "mission type",
  callId: "call",
  boardId: "board",
  proposalId: "proposal",
  coauthorIds: "co-authors",
  requiredSections: "required sections",
  reviewersPerProposal: "reviewers per proposal",
  contentType: "file type",
  filename: "file name",
  pageSize: "page size",
  q: "search",
};

function words(key: string): string {
  return (
    FIELD_WORDS[key] ??
    key
      .replace(/([a-z0-9])([A-Z])/g, "$1 $2")
      .replace(/[_-]+/g, " ")
      .toLowerCase()
  );
}

/** "the title", "the title of entry 2 in criteria", "the request" for an empty path. */
export function fieldPhrase(path: readonly PathKey[]): string {
  const keys = path.filter((k): k is string => typeof k === "string");
  const last = keys.at(-1);
  if (!last) {
    const index = path.find((k) => typeof k === "number");
    return typeof index === "number" ? `entry ${index + 1}` : "the request";
  }
  const lastIndex = path.lastIndexOf(last);
  const positions = path
    .slice(0, lastIndex)
    .flatMap((k, i) => (typeof k === "number" ? [`entry ${k + 1} in ${words(String(path[i - 1] ?? "the list"))}`] : []));
  const trailing = path.slice(lastIndex + 1).find((k) => typeof k === "number");
  const base = `the ${words(last)}${typeof trailing === "number" ? ` (entry ${trailing + 1})` : ""}`;
  return positions.length > 0 ? `${base} of ${positions.reverse().join(" of ")}` : base;
}

const capital = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);
const sentence = (s: string) => (/[.!?]$/.test(s) ? s : `${s}.`);

/** True for zod's built-in English messages, false for ones a schema wrote. */
function isZodDefault(message: string): boolean {
  return /^(Invalid (input|option|key|element|string|number|email|url|UUID|GUID|ISO|date|value|character|union|literal|type|base64|emoji|cuid|nanoid|ulid|xid|ksuid|IPv|CIDR|E\.164|JWT|hex|hostname|MAC)|Too (big|small)|Unrecognized key|Expected )/i.test(
    message,
  );
}

const TYPE_WORDS: Record<string, string> = {
  string: "text",
  number: "a number",
  int: "a whole number",
  bigint: "a whole number",
  boolean: "yes or no",
  array: "a list",
  object: "a set of fields",
  date: "a date",
  file: "a file",
};

const FORMAT_WORDS: Record<string, string> = {
  email: "an e-mail address, like name@example.org",
  url: "a web address, like https://example.org",
  uuid: "an identifier as VisViva gives them (a UUID)",
  guid: "an identifier (a UUID)",
  datetime: "a date and time, like 2026-12-02T14:00:00Z",
  date: "a date, like 2026-12-02",
  time: "a time of day, like 14:00",
};

function quantity(n: number | bigint, one: string, many: string): string {
  return `${n} ${Number(n) === 1 ? one : many}`;
}

/** One issue as a sentence. */
export function humanIssue(issue: Issue): string {
  const field = fieldPhrase(issue.path);
  const Field = capital(field);
  if (!isZodDefault(issue.message)) {
    if (/^[A-Z]/.test(issue.message)) return sentence(issue.message);
    if (/^(must|needs|cannot|can|is|are|has|have|should|starts|ends)\b/.test(issue.message)) return sentence(`${Field} ${issue.message}`);
    // An instruction ("choose a call", "use lower-case letters") reads as its own sentence.
    return sentence(capital(issue.message));
  }
  switch (issue.code) {
    case "too_big": {
      const max = Number(issue.maximum);
      const limit = issue.inclusive ? max : max - 1;
      if (issue.origin === "string") return `${Field} can be at most ${quantity(limit, "character", "characters")}.`;
      if (issue.origin === "array" || issue.origin === "set") return `${Field} can have at most ${quantity(limit, "entry", "entries")}.`;
      if (issue.origin === "file") return `${Field} can be at most ${quantity(limit, "byte", "bytes")}.`;
      return issue.inclusive ? `${Field} can be at most ${max}.` : `${Field} must be less than ${max}.`;
    }
    case "too_small": {
      const min = Number(issue.minimum);
      const limit = issue.inclusive ? min : min + 1;
      if (issue.origin === "string") return limit <= 1 ? `Enter ${field}.` : `${Field} needs at least ${quantity(limit, "character", "characters")}.`;
      if (issue.origin === "array" || issue.origin === "set") return `${Field} needs at least ${quantity(limit, "entry", "entries")}.`;
      return issue.inclusive ? `${Field} must be at least ${min}.` : `${Field} must be more than ${min}.`;
    }
    case "invalid_type":
      if (/received undefined$/.test(issue.message)) return `${Field} is missing.`;
      return `${Field} must be ${TYPE_WORDS[issue.expected] ?? issue.expected}.`;
    case "invalid_format":
      if (FORMAT_WORDS[issue.format]) return `${Field} must be ${FORMAT_WORDS[issue.format]}.`;
      if (issue.format === "starts_with" && "prefix" in issue) return `${Field} must start with "${String(issue.prefix)}".`;
      if (issue.format === "ends_with" && "suffix" in issue) return `${Field} must end with "${String(issue.suffix)}".`;
      return `${Field} is not in the expected form.`;
    case "invalid_value": {
      const values = issue.values.map((v) => (typeof v === "string" ? `"${v}"` : String(v)));
      return values.length === 1 ? `${Field} must be ${values[0]}.` : `${Field} must be one of ${values.slice(0, -1).join(", ")} or ${values.at(-1)}.`;
    }
    case "unrecognized_keys": {
      const where = issue.path.length > 0 ? ` in ${field}` : "";
      return issue.keys.length === 1
        ? `The field "${issue.keys[0]}" is not expected${where}; leave it out.`
        : `The fields ${issue.keys.map((k) => `"${k}"`).join(", ")} are not expected${where}; leave them out.`;
    }
    case "not_multiple_of":
      return `${Field} must be a multiple of ${String(issue.divisor)}.`;
    default:
      return `${Field} is not valid.`;
  }
}

/** Every issue of a failed parse as sentences, by field path ("_" for the whole input). */
export function humanFieldErrors(issues: readonly Issue[]): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const issue of issues) (out[issue.path.join(".") || "_"] ??= []).push(humanIssue(issue));
  return out;
}
