import type { Metadata } from "next";
import { PageTitle, Panel } from "@/components/ui/panel";
import { orNotFound, pageUser } from "@/lib/auth/page-guard";
import { listStations } from "@/lib/dal/stations";
import { RemoveStationButton } from "./_components/remove-station-button";
import { StationForm } from "./_components/station-form";

export const metadata: Metadata = { title: "Ground stations" };

const deg = (v: number, pos: string, neg: string) => `${Math.abs(v).toFixed(3)}° ${v < 0 ? neg : pos}`;

export default async function StationsPage({ params }: { params: Promise<{ boardId: string }> }) {
  const { boardId } = await params;
  const user = await pageUser(`/boards/${boardId}/stations`);
  const { boardName, canManage, stations } = await orNotFound(listStations(user, boardId));
  return (
    <div className="space-y-6">
      <PageTitle eyebrow={boardName} title="Ground stations">
        The stations this board counts contact with. Proposers pick from this list in contact checks; the chair keeps it.
      </PageTitle>
      <Panel title="Stations" description={stations.length === 0 ? "No stations yet." : `${stations.length} station${stations.length === 1 ? "" : "s"}`}>
        {stations.length > 0 ? (
          <table className="w-full text-left text-sm">
            <caption className="sr-only">Ground stations of {boardName}</caption>
            <thead>
              <tr className="border-b border-ink-200">
                <th scope="col" className="py-2 pr-4">
                  Name
                </th>
                <th scope="col" className="py-2 pr-4">
                  Latitude
                </th>
                <th scope="col" className="py-2 pr-4">
                  Longitude
                </th>
                <th scope="col" className="py-2 pr-4">
                  Height
                </th>
                <th scope="col" className="py-2 pr-4">
                  Minimum elevation
                </th>
                {canManage ? (
                  <th scope="col" className="py-2">
                    <span className="sr-only">Actions</span>
                  </th>
                ) : null}
              </tr>
            </thead>
            <tbody>
              {stations.map((s) => (
                <tr key={s.id} className="border-b border-ink-100">
                  <th scope="row" className="py-2 pr-4 font-semibold">
                    {s.name}
                  </th>
                  <td className="py-2 pr-4">{deg(s.latitude, "N", "S")}</td>
                  <td className="py-2 pr-4">{deg(s.longitude, "E", "W")}</td>
                  <td className="py-2 pr-4">{Math.round(s.altitude * 1000)} m</td>
                  <td className="py-2 pr-4">{s.minimumElevation}°</td>
                  {canManage ? (
                    <td className="py-2">
                      <RemoveStationButton boardId={boardId} stationId={s.id} name={s.name} />
                    </td>
                  ) : null}
                </tr>
              ))}
            </tbody>
          </table>
        ) : null}
      </Panel>
      {canManage ? (
        <Panel title="Add a station">
          <StationForm boardId={boardId} />
        </Panel>
      ) : null}
    </div>
  );
}
