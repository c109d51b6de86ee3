import { z } from "zod";
import { RANK_BY } from "@/lib/review/calibration";

/** What the panel recommends for a proposal, in our own plain words. */
export const RECOMMENDATIONS = ["recommend", "recommend with changes", "revise and resubmit", "do not recommend"] as const;
export type Recommendation = (typeof RECOMMENDATIONS)[number];

export const MEETING_NOTES_MAX = 5000;

export const startMeetingSchema = z.strictObject({
  order: z
    .array(z.uuid({ error: "Each proposal in the order must be a proposal id." }))
    .min(1, { error: "Put at least one proposal in the meeting's order." })
    .max(500, { error: "A meeting takes at most 500 proposals." }),
});

export const moveMeetingSchema = z.strictObject({
  proposalId: z.uuid({ error: "Choose the proposal to discuss." }),
});

export const meetingRecordSchema = z.strictObject({
  consensusScore: z.number({ error: "The consensus score must be a number." }).finite().nullable(),
  recommendation: z.enum(RECOMMENDATIONS, { error: `Choose a recommendation: ${RECOMMENDATIONS.join(", ")}.` }).nullable(),
  notes: z.string().max(MEETING_NOTES_MAX, { error: `The notes can be at most ${MEETING_NOTES_MAX} characters.` }),
});

export const attendanceSchema = z.strictObject({ present: z.boolean({ error: "Say whether you are present (true or false)." }) });

export const rankBySchema = z.strictObject({ rankBy: z.enum(RANK_BY, { error: "Rank by raw or calibrated means." }) });

export const meetingEventsQuerySchema = z.strictObject({
  once: z.enum(["1"], { error: "once may only be 1 (send the current state and close)." }).optional(),
});
