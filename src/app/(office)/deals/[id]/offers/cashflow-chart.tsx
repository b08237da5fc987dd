"use client";
import { CartesianGrid, Legend, Line, LineChart, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import { formatCents, formatCentsCompact } from "@/lib/format";

/** One line per offer: copper, slate blue, sage (the tokens in tailwind.config.ts). */
export const OFFER_COLORS = ["#B5542D", "#3E5C76", "#5B7F6B"] as const;

export function CashflowChart({ series }: { series: { name: string; cumulativeCents: number[] }[] }) {
  const years = Math.max(0, ...series.map((s) => s.cumulativeCents.length));
  const data = Array.from({ length: years }, (_, year) => {
    const row: Record<string, number> = { year };
    series.forEach((s, i) => {
      if (s.cumulativeCents[year] !== undefined) row[`o${i}`] = Math.round(s.cumulativeCents[year] / 100);
    });
    return row;
  });
  const label = `Cumulative cash flow by year: ${series.map((s) => `${s.name} ends at ${formatCents(s.cumulativeCents[s.cumulativeCents.length - 1] ?? 0)}`).join("; ")}`;
  return (
    <figure data-testid="cashflow-chart">
      <div className="h-72 w-full" role="img" aria-label={label}>
        <ResponsiveContainer width="100%" height="100%">
          <LineChart data={data} margin={{ top: 8, right: 16, bottom: 0, left: 8 }}>
            <CartesianGrid vertical={false} stroke="#E2D9CB" />
            <XAxis dataKey="year" tickLine={false} axisLine={false} fontSize={12} />
            <YAxis tickLine={false} axisLine={false} fontSize={12} width={72} tickFormatter={(v: number) => formatCentsCompact(v * 100)} />
            <ReferenceLine y={0} stroke="#52606D" />
            <Tooltip formatter={(v, name) => [formatCents(Number(v) * 100), series[Number(String(name).slice(1))]?.name ?? String(name)]} labelFormatter={(y) => `Year ${y}`} />
            <Legend formatter={(v: string) => series[Number(v.slice(1))]?.name ?? v} />
            {series.map((s, i) => (
              <Line key={s.name + i} type="monotone" dataKey={`o${i}`} stroke={OFFER_COLORS[i % OFFER_COLORS.length]} strokeWidth={2} dot={false} isAnimationActive={false} />
            ))}
          </LineChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="mt-1 text-xs text-graphite-soft">Cumulative cash flow: what the household is ahead (or behind) after each year, incentives and loan payments included.</figcaption>
    </figure>
  );
}
