import type { Metadata } from "next";
import Link from "next/link";
import { NoAccess } from "@/components/no-access";
import { Field, SelectField } from "@/components/ui/field";
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
            the arrow keys to change column, Space to drop (Escape cancels); Enter opens the deal.
          </p>
        </div>
      </div>
      <form action="/board" className="mt-3 flex flex-wrap items-end gap-3 px-2 md:px-4" aria-label="Filter the board">
        {office ? (
          <SelectField id="board-rep" name="rep" label="Rep" className="w-44" defaultValue={filter.rep ?? ""} options={[{ value: "", label: "Everyone" }, ...owners.map((o) => ({ value: o.id, label: o.name }))]} />
        ) : null}
        <SelectField id="board-source" name="source" label="Source" className="w-44" defaultValue={filter.source ?? ""} options={[{ value: "", label: "Any source" }, ...sources.map((s) => ({ value: s, label: s }))]} />
        <Field id="board-from" name="from" label="Created from" type="date" className="w-44" defaultValue={filter.from ?? ""} />
        <Field id="board-to" name="to" label="Created to" type="date" className="w-44" defaultValue={filter.to ?? ""} />
        <button type="submit" className="btn-quiet">
          Apply filters
        </button>
        {filtered ? (
          <Link href="/board" className="btn-quiet">
            Clear
          </Link>
        ) : null}
      </form>
      <BoardClient key={JSON.stringify([filter, limits])} cards={cards} stallDays={limits} userId={member.userId} />
    </div>
  );
}
