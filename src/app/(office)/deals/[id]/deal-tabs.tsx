import { LinkTabs } from "@/components/ui/tabs";

export function DealTabs({ dealId, tabs }: { dealId: string; tabs: { segment: string; label: string }[] }) {
  const base = `/deals/${dealId}`;
  return <LinkTabs label="Deal" exact className="mt-4" pages={tabs.map((t) => ({ href: t.segment ? `${base}/${t.segment}` : base, label: t.label }))} />;
}
