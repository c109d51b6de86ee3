"use client";
// Labelled inputs, messages and the submit button shared by VisViva's forms, plus a hook
// that posts a form to a server action and keeps its {ok, error, fieldErrors} answer.
import { useId, useState, useTransition, type InputHTMLAttributes, type ReactNode, type SelectHTMLAttributes } from "react";

export type ActionAnswer<T = unknown> = { ok: true; data: T } | { ok: false; error: string; fieldErrors?: Record<string, string[]>; status?: number };

export function useActionForm<T>(run: (input: FormData) => Promise<ActionAnswer<T>>, onDone?: (data: T, form: HTMLFormElement) => void | Promise<void>) {
  const [pending, startTransition] = useTransition();
  const [answer, setAnswer] = useState<ActionAnswer<T> | null>(null);
  const onSubmit = (event: React.FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const form = event.currentTarget;
    const data = new FormData(form);
    startTransition(async () => {
      const result = await run(data);
      setAnswer(result);
      if (result.ok && onDone) await onDone(result.data, form);
    });
  };
  const fieldError = (name: string) => (answer && !answer.ok ? answer.fieldErrors?.[name]?.[0] : undefined);
  return { pending, answer, onSubmit, fieldError, setAnswer };
}

const inputClass =
  "mt-1 block w-full rounded-chip border border-ink-300 bg-white px-3 py-2 text-ink-900 shadow-sm placeholder:text-ink-400 focus:border-trajectory-500 aria-[invalid=true]:border-void-500";

/**
 * "12 of 200 characters" under a field with a length limit; turns to a warning in the last
 * tenth. Linked to the field by aria-describedby (not a live region: it would speak every key).
 */
export function CharacterCount({ id, length, max }: { id: string; length: number; max: number }) {
  const near = length >= max * 0.9;
  return (
    <p id={id} data-character-count="" className={`mt-1 text-right text-xs ${near ? "font-semibold text-drift-700" : "text-ink-500"}`}>
      {length} of {max} characters{length >= max ? " (the limit)" : ""}
    </p>
  );
}

/** Tracks a field's length for its CharacterCount; spread `onInput` on the field. */
export function useCharacterCount(initial: unknown) {
  const [length, setLength] = useState(() => String(initial ?? "").length);
  const onInput = (event: React.FormEvent<HTMLInputElement | HTMLTextAreaElement>) => setLength(event.currentTarget.value.length);
  return { length, onInput };
}

export function TextField({
  label,
  hint,
  error,
  ...input
}: InputHTMLAttributes<HTMLInputElement> & { label: string; hint?: string; error?: string; name: string }) {
  const id = useId();
  const hintId = hint ? `${id}-hint` : undefined;
  const errorId = error ? `${id}-error` : undefined;
  const limited =
    typeof input.maxLength === "number" && input.maxLength > 0 && !["email", "password", "number", "datetime-local", "date"].includes(input.type ?? "");
  const counterId = limited ? `${id}-count` : undefined;
  const counted = useCharacterCount(input.value ?? input.defaultValue);
  const length = input.value !== undefined ? String(input.value).length : counted.length;
  return (
    <div>
      <label htmlFor={id} className="block text-sm font-semibold text-ink-800">
        {label}
      </label>
      {hint ? (
        <p id={hintId} className="text-xs text-ink-500">
          {hint}
        </p>
      ) : null}
      <input
        id={id}
        aria-invalid={error ? true : undefined}
        aria-describedby={[hintId, errorId, counterId].filter(Boolean).join(" ") || undefined}
        className={inputClass}
        {...input}
        onInput={(event) => {
          counted.onInput(event);
          input.onInput?.(event);
        }}
      />
      {limited && counterId ? <CharacterCount id={counterId} length={length} max={input.maxLength!} /> : null}
      {error ? (
        <p id={errorId} className="mt-1 text-sm text-void-700">
          {error}
        </p>
      ) : null}
    </div>
  );
}

export function SelectField({
  label,
  error,
  children,
  ...select
}: SelectHTMLAttributes<HTMLSelectElement> & { label: string; error?: string; name: string; children: ReactNode }) {
  const id = useId();
  return (
    <div>
      <label htmlFor={id} className="block text-sm font-semibold text-ink-800">
        {label}
      </label>
      <select id={id} aria-invalid={error ? true : undefined} className={inputClass} {...select}>
        {children}
      </select>
      {error ? <p className="mt-1 text-sm text-void-700">{error}</p> : null}
    </div>
  );
}

export function CheckboxField({ label, hint, ...input }: InputHTMLAttributes<HTMLInputElement> & { label: string; hint?: string; name: string }) {
  const id = useId();
  return (
    <div className="flex items-start gap-3">
      <input
        id={id}
        type="checkbox"
        className="mt-1 h-4 w-4 rounded border-ink-300 accent-trajectory-600"
        aria-describedby={hint ? `${id}-hint` : undefined}
        {...input}
      />
      <div>
        <label htmlFor={id} className="font-semibold text-ink-800">
          {label}
        </label>
        {hint ? (
          <p id={`${id}-hint`} className="text-sm text-ink-600">
            {hint}
          </p>
        ) : null}
      </div>
    </div>
  );
}

export function SubmitButton({ pending, children, tone = "brand" }: { pending: boolean; children: ReactNode; tone?: "brand" | "quiet" | "danger" }) {
  const tones = {
    brand: "bg-trajectory-600 text-white hover:bg-trajectory-700",
    quiet: "border border-ink-300 bg-white text-ink-800 hover:border-trajectory-500",
    danger: "bg-void-700 text-white hover:bg-void-500",
  };
  return (
    <button type="submit" disabled={pending} aria-busy={pending} className={`rounded-chip px-4 py-2 font-semibold disabled:opacity-60 ${tones[tone]}`}>
      {pending ? "Working…" : children}
    </button>
  );
}

export function FormNotice({ tone, children }: { tone: "error" | "success" | "info"; children: ReactNode }) {
  const tones = {
    error: "border-void-500/50 bg-void-100 text-void-700",
    success: "border-holds-500/50 bg-holds-100 text-holds-700",
    info: "border-trajectory-400/50 bg-trajectory-100 text-trajectory-700",
  };
  return (
    <p role={tone === "error" ? "alert" : "status"} className={`rounded-chip border px-3 py-2 text-sm ${tones[tone]}`}>
      {children}
    </p>
  );
}

/** The answer of the last submit: the error, or a success text. */
export function ActionNotice({ answer, success }: { answer: ActionAnswer | null; success?: string }) {
  if (!answer) return null;
  if (!answer.ok) return <FormNotice tone="error">{answer.error}</FormNotice>;
  return success ? <FormNotice tone="success">{success}</FormNotice> : null;
}
