"use client";
// The chair's rubric editor: criteria with weights (adding up to 100 %), one scale for the
// rubric with a descriptor per level, and a comment threshold per criterion.
import { useState } from "react";
import type { RubricView } from "@/lib/dal/rubrics";
import type { RubricCriterion } from "@/lib/review/rubric";
import { rubricProblems, weightSum } from "@/lib/review/rubric";
import { callApi } from "./api";
import { CharacterCount } from "@/components/ui/form-controls";

const defaultLevels = (min: number, max: number, old: string[] = []) => Array.from({ length: max - min + 1 }, (_, i) => old[i] ?? "");

const slug = (title: string, taken: Set<string>) => {
  const base =
    title
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, "-")
      .replace(/^-|-$/g, "")
      .slice(0, 50) || "criterion";
  let id = base;
  for (let n = 2; taken.has(id); n++) id = `${base}-${n}`;
  return id;
};

export function RubricEditor({ boardId, callId, rubric }: { boardId: string; callId: string; rubric: RubricView | null }) {
  const [name, setName] = useState(rubric?.name ?? "Review rubric");
  const [scale, setScale] = useState({ min: rubric?.criteria[0]?.scaleMin ?? 1, max: rubric?.criteria[0]?.scaleMax ?? 5 });
  const [criteria, setCriteria] = useState<RubricCriterion[]>(
    rubric?.criteria ?? [
      {
        id: "science-return",
        title: "Science return",
        description: "",
        weight: 100,
        scaleMin: 1,
        scaleMax: 5,
        levels: defaultLevels(1, 5),
        commentRequiredBelow: 3,
      },
    ],
  );
  const [answer, setAnswer] = useState<{ tone: "error" | "success"; text: string; issues?: string[] } | null>(null);
  const [frozen, setFrozen] = useState(Boolean(rubric?.frozenAt));
  const [pending, setPending] = useState(false);

  const update = (i: number, patch: Partial<RubricCriterion>) => setCriteria((cs) => cs.map((c, j) => (j === i ? { ...c, ...patch } : c)));
  const changeScale = (min: number, max: number) => {
    setScale({ min, max });
    if (max > min && max - min <= 10) setCriteria((cs) => cs.map((c) => ({ ...c, scaleMin: min, scaleMax: max, levels: defaultLevels(min, max, c.levels) })));
  };
  const sum = weightSum(criteria);
  const localProblems = rubricProblems(criteria);

  return (
    <form
      className="space-y-5"
      onSubmit={async (e) => {
        e.preventDefault();
        setPending(true);
        // New criteria get a readable id from their title (ids of saved criteria never change).
        const taken = new Set<string>();
        const prepared = criteria.map((c) => {
          const id = c.title && c.id.startsWith("criterion-") ? slug(c.title, taken) : c.id;
          taken.add(id);
          return { ...c, id };
        });
        setCriteria(prepared);
        const res = await callApi<{ rubric: RubricView & { createdVersion: boolean } }>(`/api/v1/boards/${boardId}/rubrics/${callId}`, {
          method: "PUT",
          body: { name, criteria: prepared },
        });
        setPending(false);
        if (res.ok) {
          setFrozen(false);
          setAnswer({
            tone: "success",
            text:
              res.data.rubric.createdVersion && res.data.rubric.version > 1
                ? `Saved as version ${res.data.rubric.version}; reviews already started keep the version they began with.`
                : `Saved (version ${res.data.rubric.version}).`,
          });
        } else setAnswer({ tone: "error", text: res.error, issues: ((res.details as { issues?: { message: string }[] })?.issues ?? []).map((i) => i.message) });
      }}
    >
      {frozen ? (
        <p className="rounded-chip border border-drift-500/50 bg-drift-100 px-3 py-2 text-sm text-drift-700">
          Reviews have started with this version, so it is frozen. Saving makes a new version for reviews not yet started.
        </p>
      ) : null}
      <div className="grid gap-4 sm:grid-cols-3">
        <div className="sm:col-span-1">
          <label className="text-sm font-semibold">
            Rubric name
            <input
              value={name}
              onChange={(e) => setName(e.target.value)}
              required
              maxLength={200}
              aria-describedby="rubric-name-count"
              className="mt-1 block w-full rounded-chip border border-ink-300 px-3 py-1.5 font-normal"
            />
          </label>
          <CharacterCount id="rubric-name-count" length={name.length} max={200} />
        </div>
        <label className="text-sm font-semibold">
          Scale from
          <input
            type="number"
            min={0}
            max={9}
            value={scale.min}
            onChange={(e) => changeScale(Number(e.target.value), scale.max)}
            className="mt-1 block w-full rounded-chip border border-ink-300 px-3 py-1.5 font-normal"
          />
        </label>
        <label className="text-sm font-semibold">
          to
          <input
            type="number"
            min={1}
            max={10}
            value={scale.max}
            onChange={(e) => changeScale(scale.min, Number(e.target.value))}
            className="mt-1 block w-full rounded-chip border border-ink-300 px-3 py-1.5 font-normal"
          />
        </label>
      </div>
      <ol className="space-y-4">
        {criteria.map((c, i) => (
          <li key={i} className="rounded-panel border border-ink-200 bg-white p-4" data-criterion-editor={c.id}>
            <div className="grid gap-3 sm:grid-cols-[1fr_8rem_10rem]">
              <div>
                <label className="text-sm font-semibold">
                  Criterion {i + 1}
                  <input
                    value={c.title}
                    onChange={(e) => update(i, { title: e.target.value })}
                    required
                    maxLength={200}
                    aria-describedby={`criterion-${i}-title-count`}
                    className="mt-1 block w-full rounded-chip border border-ink-300 px-3 py-1.5 font-normal"
                  />
                </label>
                <CharacterCount id={`criterion-${i}-title-count`} length={c.title.length} max={200} />
              </div>
              <label className="text-sm font-semibold">
                Weight (%)
                <input
                  type="number"
                  step="any"
                  min={0}
                  max={100}
                  value={c.weight}
                  onChange={(e) => update(i, { weight: Number(e.target.value) })}
                  className="mt-1 block w-full rounded-chip border border-ink-300 px-3 py-1.5 font-mono font-normal"
                />
              </label>
              <label className="text-sm font-semibold">
                Comment required below
                <select
                  value={c.commentRequiredBelow ?? ""}
                  onChange={(e) => update(i, { commentRequiredBelow: e.target.value === "" ? null : Number(e.target.value) })}
                  className="mt-1 block w-full rounded-chip border border-ink-300 bg-white px-2 py-1.5 font-normal"
                >
                  <option value="">never</option>
                  {Array.from({ length: scale.max - scale.min + 1 }, (_, k) => scale.min + k + 1).map((v) => (
                    <option key={v} value={v}>
                      {v}
                    </option>
                  ))}
                </select>
              </label>
            </div>
            <label className="mt-3 block text-sm font-semibold">
              Description
              <textarea
                value={c.description}
                onChange={(e) => update(i, { description: e.target.value })}
                rows={2}
                maxLength={4000}
                aria-describedby={`criterion-${i}-description-count`}
                className="mt-1 block w-full rounded-chip border border-ink-300 px-3 py-1.5 font-normal"
              />
            </label>
            <CharacterCount id={`criterion-${i}-description-count`} length={c.description.length} max={4000} />
            <fieldset className="mt-3">
              <legend className="text-sm font-semibold">Level descriptors</legend>
              <div className="mt-1 grid gap-2 sm:grid-cols-5">
                {c.levels.map((level, k) => (
                  <label key={k} className="text-xs font-semibold text-ink-700">
                    {scale.min + k}
                    <input
                      value={level}
                      onChange={(e) => update(i, { levels: c.levels.map((l, m) => (m === k ? e.target.value : l)) })}
                      required
                      maxLength={300}
                      className="mt-0.5 block w-full rounded-chip border border-ink-300 px-2 py-1 text-sm font-normal"
                    />
                  </label>
                ))}
              </div>
            </fieldset>
            <button
              type="button"
              onClick={() => setCriteria((cs) => cs.filter((_, j) => j !== i))}
              disabled={criteria.length === 1}
              className="mt-3 text-sm text-void-700 underline disabled:opacity-40"
            >
              Remove this criterion
            </button>
          </li>
        ))}
      </ol>
      <div className="flex flex-wrap items-center gap-4">
        <button
          type="button"
          className="rounded-chip border border-ink-300 px-3 py-1.5 text-sm font-semibold hover:border-trajectory-500"
          onClick={() =>
            setCriteria((cs) => [
              ...cs,
              {
                id: slug(`criterion ${cs.length + 1}`, new Set(cs.map((x) => x.id))),
                title: "",
                description: "",
                weight: 0,
                scaleMin: scale.min,
                scaleMax: scale.max,
                levels: defaultLevels(scale.min, scale.max),
                commentRequiredBelow: null,
              },
            ])
          }
        >
          Add a criterion
        </button>
        <p role="status" className={`text-sm font-semibold ${Math.abs(sum - 100) < 1e-6 ? "text-holds-700" : "text-void-700"}`}>
          Weights add up to {Number(sum.toFixed(4))} % {Math.abs(sum - 100) < 1e-6 ? "✓" : "(must be 100 %)"}
        </p>
      </div>
      {answer ? (
        <div
          role={answer.tone === "error" ? "alert" : "status"}
          className={`rounded-chip border px-3 py-2 text-sm ${answer.tone === "error" ? "border-void-500/50 bg-void-100 text-void-700" : "border-holds-500/50 bg-holds-100 text-holds-700"}`}
        >
          {answer.text}
        </div>
      ) : null}
      <button
        type="submit"
        disabled={pending}
        className="rounded-chip bg-trajectory-600 px-4 py-2 font-semibold text-white hover:bg-trajectory-700 disabled:opacity-60"
      >
        {pending ? "Saving…" : "Save rubric"}
      </button>
      {localProblems.length && !answer ? (
        <p className="text-xs text-ink-500">{localProblems.length} thing(s) to fix before saving; the server checks them too.</p>
      ) : null}
    </form>
  );
}
