"use client";
import { Bar, BarChart, CartesianGrid, Legend, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";

const MONTHS = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"];
// The tokens (tailwind.config.ts): slate blue for usage, copper for production.
const USAGE = "#3E5C76";
const PRODUCTION = "#B5542D";

/** Monthly usage beside the estimated production, kWh. */
export function ProductionChart({ usageKwh, productionKwh }: { usageKwh: number[]; productionKwh: number[] }) {
  const data = MONTHS.map((month, i) => ({ month, usage: Math.round(usageKwh[i] ?? 0), production: Math.round(productionKwh[i] ?? 0) }));
  const label = `Monthly usage and estimated production: ${data.map((d) => `${d.month} ${d.usage} kWh used, ${d.production} kWh produced`).join("; ")}`;
  return (
    <figure data-testid="production-chart">
      <div className="h-64 w-full" role="img" aria-label={label}>
        <ResponsiveContainer width="100%" height="100%">
          <BarChart data={data} margin={{ top: 8, right: 8, bottom: 0, left: 0 }} barGap={2}>
            <CartesianGrid vertical={false} stroke="#E2D9CB" />
            <XAxis dataKey="month" tickLine={false} axisLine={false} fontSize={12} />
            <YAxis tickLine={false} axisLine={false} fontSize={12} width={48} />
            <Tooltip formatter={(v, name) => [`${Number(v).toLocaleString("en-US")} kWh`, name === "usage" ? "Usage" : "Production"]} />
            <Legend formatter={(v) => (v === "usage" ? "Usage" : "Estimated production")} />
            <Bar dataKey="usage" fill={USAGE} radius={[3, 3, 0, 0]} isAnimationActive={false} />
            <Bar dataKey="production" fill={PRODUCTION} radius={[3, 3, 0, 0]} isAnimationActive={false} />
          </BarChart>
        </ResponsiveContainer>
      </div>
    </figure>
  );
}
