import type { Metadata } from "next";
import Link from "next/link";
import { NoAccess } from "@/components/no-access";
import { daysSince } from "@/lib/format";
import { can } from "@/lib/permissions";
import { boardFilterSchema, isStalled } from "@/lib/stage-rules";
import { getCompanySettings } from "@/server/company-settings";
import { getMember } from "@/server/session";
import { listBoardDeals, listBoardOwners, listBoardSources } from "@/server/stages";
import { BoardClient, type BoardCard } from "./board-client";

export const metadata: Metadata = { title: "Board" };

export default async function BoardPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const member = await getMember();
  if (!member) return null;
  if (!can(member.role, "deals:read-own")) return <NoAccess section="Board" />;
  const raw = await searchParams;
  const filter = boardFilterSchema.parse({
    rep: typeof raw.rep === "string" ? raw.rep : undefined,
    source: typeof raw.source === "string" ? raw.source : undefined,
    from: typeof raw.from === "string" && raw.from ? raw.from : undefined,
    to: typeof raw.to === "string" && raw.to ? raw.to : undefined,
  });
  const office = can(member.role, "deals:read-all");
  const [deals, owners, sources, settings] = await Promise.all([
    listBoardDeals(member, filter),
    office ? listBoardOwners(member) : [],
    listBoardSources(member),
    getCompanySettings(member.companyId),
  ]);
  const limits = settings.stallLimits;
  const now = new Date();
  const cards: BoardCard[] = deals.map((d) => {
    const days = daysSince(d.stageChangedAt, now);
    return {
      id: d.id,
      stage: d.stage,
      householdName: d.householdName,
      city: d.city,
      systemDcWatts: d.systemDcWatts,
      contractCents: d.contractCents,
      daysInStage: days,
      stalled: isStalled(d.stage, days, limits),
      ownerName: d.ownerName,
    };
  });
  const filtered = Boolean(filter.rep || filter.source || filter.from || filter.to);

  return (
    <div className="-mx-2 md:-mx-4">
      <div className="flex flex-wrap items-end justify-between gap-3 px-2 md:px-4">
        <div>
          <h1 className="text-2xl font-semibold">{office ? "Board" : "Your board"}</h1>
          <p className="mt-1 text-sm text-graphite-soft">
            <span className="figure">{cards.length}</span> deal{cards.length === 1 ? "" : "s"}
            {filtered ? " matching the filters" : ""}. Drag a card to move it; by keyboard, focus a card, press Space to pick it up,
            the arrow keys to change column, Space to drop (Escape cancels).
          </p>
        </div>
      </div>
      <form action="/board" className="mt-3 flex flex-wrap items-end gap-3 px-2 md:px-4" aria-label="Filter the board">
        {office ? (
          <div className="w-44">
            <label htmlFor="board-rep" className="field-label">
              Rep
            </label>
            <select id="board-rep" name="rep" defaultValue={filter.rep ?? ""} className="field-input">
              <option value="">Everyone</option>
              {owners.map((o) => (
                <option key={o.id} value={o.id}>
                  {o.name}
                </option>
              ))}
            </select>
          </div>
        ) : null}
        <div className="w-44">
          <label htmlFor="board-source" className="field-label">
            Source
          </label>
          <select id="board-source" name="source" defaultValue={filter.source ?? ""} className="field-input">
            <option value="">Any source</option>
            {sources.map((s) => (
              <option key={s} value={s}>
                {s}
              </option>
            ))}
          </select>
        </div>
        <div className="w-44">
          <label htmlFor="board-from" className="field-label">
            Created from
          </label>
          <input id="board-from" type="date" name="from" defaultValue={filter.from ?? ""} className="field-input" />
        </div>
        <div className="w-44">
          <label htmlFor="board-to" className="field-label">
            Created to
          </label>
          <input id="board-to" type="date" name="to" defaultValue={filter.to ?? ""} className="field-input" />
        </div>
        <button type="submit" className="btn-quiet">
          Apply filters
        </button>
        {filtered ? (
          <Link href="/board" className="btn-quiet">
            Clear
          </Link>
        ) : null}
      </form>
      <BoardClient key={JSON.stringify([filter, limits])} cards={cards} stallDays={limits} />
    </div>
  );
}
