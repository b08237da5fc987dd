"use client";
import { Bar, BarChart, CartesianGrid, Cell, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";

const MONTHS = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"];
const USAGE = "#3E5C76"; // slate blue: usage data (tailwind.config.ts)

/** Monthly kWh; estimated months are hatched so they never pass for measured ones. */
export function UsageChart({ monthlyKwh, estimated }: { monthlyKwh: number[]; estimated: boolean[] }) {
  const data = monthlyKwh.map((kwh, i) => ({ month: MONTHS[i], kwh: Math.round(kwh), estimated: estimated[i] }));
  return (
    <figure>
      <div className="h-64 w-full" role="img" aria-label={`Monthly usage: ${data.map((d) => `${d.month} ${d.kwh} kWh${d.estimated ? " (estimated)" : ""}`).join(", ")}`}>
        <ResponsiveContainer width="100%" height="100%">
          <BarChart data={data} margin={{ top: 8, right: 8, bottom: 0, left: 0 }}>
            <defs>
              <pattern id="estimated-hatch" width="6" height="6" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
                <rect width="6" height="6" fill="#DCE4EC" />
                <line x1="0" y1="0" x2="0" y2="6" stroke={USAGE} strokeWidth="2" />
              </pattern>
            </defs>
            <CartesianGrid vertical={false} stroke="#E2D9CB" />
            <XAxis dataKey="month" tickLine={false} axisLine={false} fontSize={12} />
            <YAxis tickLine={false} axisLine={false} fontSize={12} width={48} unit="" />
            <Tooltip formatter={(v, _n, item) => [`${Number(v).toLocaleString("en-US")} kWh${(item.payload as { estimated: boolean }).estimated ? " (estimated)" : ""}`, "Usage"]} />
            <Bar dataKey="kwh" radius={[3, 3, 0, 0]} isAnimationActive={false}>
              {data.map((d) => (
                <Cell key={d.month} fill={d.estimated ? "url(#estimated-hatch)" : USAGE} stroke={USAGE} />
              ))}
            </Bar>
          </BarChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="mt-2 flex gap-4 text-xs text-graphite-soft">
        <span className="inline-flex items-center gap-1">
          <span className="inline-block h-3 w-3 rounded-sm bg-usage" /> measured
        </span>
        <span className="inline-flex items-center gap-1">
          <span className="inline-block h-3 w-3 rounded-sm border border-usage bg-slate-light" style={{ backgroundImage: "repeating-linear-gradient(45deg, #3E5C76 0 2px, transparent 2px 6px)" }} /> estimated
        </span>
      </figcaption>
    </figure>
  );
}
