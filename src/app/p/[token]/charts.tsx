"use client";
// The customer's two charts, sized for a phone: monthly usage (slate blue) against estimated
// production (copper), and the cumulative cash flow over the years of the table.
import { Bar, BarChart, CartesianGrid, Legend, Line, LineChart, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import { formatCentsCompact, formatSignedCents } from "@/lib/format";

const MONTHS = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"];
const USAGE = "#3E5C76";
const PRODUCTION = "#B5542D";
const GRID = "#E2D9CB";

export function UsageProductionChart({ usageKwh, productionKwh }: { usageKwh: number[]; productionKwh: number[] }) {
  const data = MONTHS.map((month, i) => ({ month, usage: Math.round(usageKwh[i] ?? 0), production: Math.round(productionKwh[i] ?? 0) }));
  const label = `Monthly electricity use and estimated solar production: ${data.map((d) => `${d.month} ${d.usage} kWh used, ${d.production} kWh produced`).join("; ")}`;
  return (
    <figure data-testid="usage-production-chart">
      <div className="h-56 w-full" role="img" aria-label={label}>
        <ResponsiveContainer width="100%" height="100%">
          <BarChart data={data} margin={{ top: 8, right: 4, bottom: 0, left: -8 }} barGap={1}>
            <CartesianGrid vertical={false} stroke={GRID} />
            <XAxis dataKey="month" tickLine={false} axisLine={false} fontSize={11} interval={0} tickFormatter={(m: string) => m.slice(0, 1)} />
            <YAxis tickLine={false} axisLine={false} fontSize={11} width={44} />
            <Tooltip formatter={(v, name) => [`${Number(v).toLocaleString("en-US")} kWh`, name === "usage" ? "You use" : "Solar makes"]} />
            <Legend formatter={(v) => (v === "usage" ? "You use" : "Solar makes (estimate)")} wrapperStyle={{ fontSize: 12 }} />
            <Bar dataKey="usage" fill={USAGE} radius={[2, 2, 0, 0]} isAnimationActive={false} />
            <Bar dataKey="production" fill={PRODUCTION} radius={[2, 2, 0, 0]} isAnimationActive={false} />
          </BarChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="mt-1 text-xs text-graphite-soft">kWh per month: your usage against the system&apos;s estimated production in year 1.</figcaption>
    </figure>
  );
}

export function CashflowChart({ cumulativeCents }: { cumulativeCents: number[] }) {
  const data = cumulativeCents.map((c, year) => ({ year, dollars: Math.round(c / 100) }));
  const last = cumulativeCents[cumulativeCents.length - 1] ?? 0;
  const label = `Cumulative cash flow over ${data.length - 1} years, ending at ${formatSignedCents(last)}`;
  return (
    <figure data-testid="cashflow-chart">
      <div className="h-56 w-full" role="img" aria-label={label}>
        <ResponsiveContainer width="100%" height="100%">
          <LineChart data={data} margin={{ top: 8, right: 8, bottom: 0, left: 0 }}>
            <CartesianGrid vertical={false} stroke={GRID} />
            <XAxis dataKey="year" tickLine={false} axisLine={false} fontSize={11} />
            <YAxis tickLine={false} axisLine={false} fontSize={11} width={52} tickFormatter={(v: number) => formatCentsCompact(v * 100)} />
            <ReferenceLine y={0} stroke="#52606D" />
            <Tooltip formatter={(v) => [formatSignedCents(Number(v) * 100), "Ahead (or behind)"]} labelFormatter={(y) => `Year ${y}`} />
            <Line type="monotone" dataKey="dollars" stroke={PRODUCTION} strokeWidth={2} dot={false} isAnimationActive={false} />
          </LineChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="mt-1 text-xs text-graphite-soft">
        Cumulative cash flow: how far ahead (or behind) you are after each year, counting the price, incentives, loan payments and bill savings.
      </figcaption>
    </figure>
  );
}
