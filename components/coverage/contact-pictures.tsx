// The contact block's pictures and daily figures, for a contactTime claim.
import { contactPicture } from "@/lib/orbit";
import { ContactTimeline } from "./contact-timeline";
import { GroundTrackMap } from "./ground-track-map";

const perDay = (s: unknown) => (typeof s === "number" ? `${(s / 60).toFixed(1)} min` : "—");

export function ContactPictures({ claim, label, computed }: { claim: unknown; label: string; computed: Record<string, unknown> }) {
  const { picture, message } = contactPicture(claim);
  if (!picture) return message ? <p className="text-xs text-ink-600">No contact picture: {message}</p> : null;
  const name = label || "the contact check";
  return (
    <div className="space-y-3" data-contact-pictures="">
      <dl className="grid grid-cols-[auto_1fr] gap-x-3 text-sm" aria-label={`Contact figures of ${name}`}>
        <dt className="font-semibold">Passes per day</dt>
        <dd>
          {typeof computed.passesPerDay === "number"
            ? `${computed.passesPerDay.toFixed(2)} on average (${computed.passesPerDayMin} to ${computed.passesPerDayMax})`
            : "—"}
        </dd>
        <dt className="font-semibold">Contact per day</dt>
        <dd>
          {perDay(computed.contactPerDay)} on average, {perDay(computed.contactPerDayMin)} on the least day
        </dd>
        <dt className="font-semibold">Longest gap</dt>
        <dd>{typeof computed.longestGap === "number" ? `${(computed.longestGap / 3600).toFixed(1)} h` : "—"}</dd>
        {typeof computed.dataVolumePerDay === "number" ? (
          <>
            <dt className="font-semibold">Data volume per day</dt>
            <dd>
              {computed.dataVolumePerDay.toFixed(1)} Gbit on average
              {typeof computed.dataVolumePerDayMin === "number" ? `, ${computed.dataVolumePerDayMin.toFixed(1)} Gbit on the least day` : ""} (contact time ×
              data rate)
            </dd>
          </>
        ) : null}
      </dl>
      <ContactTimeline picture={picture} title={`Contact timeline of ${name}`} />
      <GroundTrackMap picture={picture} title={`Ground track of ${name}`} />
    </div>
  );
}
