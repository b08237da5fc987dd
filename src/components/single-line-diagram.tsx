"use client";
import { useId, useState } from "react";
import { ScrollRegion } from "@/components/ui/scroll-region";
import type { Drawing } from "@/lib/single-line-diagram";

const INK = "#1f2933";
const ZOOMS = [{ w: "100%", label: "Fit" }, { w: "1100px", label: "Large" }, { w: "1600px", label: "Full size" }] as const;

/**
 * The single-line diagram (src/lib/single-line-diagram.ts) as inline SVG. On a phone it scrolls
 * sideways in a ScrollRegion and pinch-zooms with the page; the zoom buttons widen it. The
 * drawing is an image with a title and a description, and the same description is listed in
 * words below it (the text alternative).
 */
export function SingleLineDiagram({ drawing }: { drawing: Drawing }) {
  const id = useId();
  const [zoom, setZoom] = useState(0); // fits the page; the buttons widen it (a phone then scrolls it sideways in its region)
  return (
    <figure className="space-y-2" data-testid="single-line-diagram">
      <div className="flex flex-wrap items-center gap-2 text-sm" role="group" aria-label="Diagram size">
        {ZOOMS.map((z, i) => (
          <button key={z.label} type="button" className={`btn-quiet ${i === zoom ? "font-semibold underline" : ""}`} aria-pressed={i === zoom} onClick={() => setZoom(i)}>
            {z.label}
          </button>
        ))}
      </div>
      <ScrollRegion label="Single-line diagram" tone="white" innerClassName="rounded border border-line bg-white">
        <svg viewBox={`0 0 ${drawing.width} ${drawing.height}`} style={{ width: ZOOMS[zoom].w, minWidth: zoom === 0 ? undefined : ZOOMS[zoom].w }} role="img" aria-labelledby={`${id}-t ${id}-d`} className="block h-auto">
          <title id={`${id}-t`}>{drawing.title}</title>
          <desc id={`${id}-d`}>{drawing.description.join(" ")}</desc>
          {drawing.shapes.map((s, i) => {
            const stroke = { stroke: INK, fill: "none", strokeWidth: "heavy" in s && s.heavy ? 3 : 1.5, strokeDasharray: "dash" in s && s.dash ? "8 6" : undefined };
            if (s.k === "rect") return <rect key={i} x={s.x} y={s.y} width={s.w} height={s.h} {...stroke} />;
            if (s.k === "line") return <line key={i} x1={s.x1} y1={s.y1} x2={s.x2} y2={s.y2} {...stroke} />;
            if (s.k === "circle") return <circle key={i} cx={s.cx} cy={s.cy} r={s.r} {...stroke} />;
            return (
              <text key={i} x={s.x} y={s.y} fontSize={s.size} textAnchor={s.anchor} fontWeight={s.bold ? 600 : undefined} fill={INK}>
                {s.text}
              </text>
            );
          })}
        </svg>
      </ScrollRegion>
      <figcaption>
        <details className="text-sm">
          <summary className="cursor-pointer">The diagram in words</summary>
          <ol className="mt-2 list-decimal space-y-1 pl-5" data-testid="single-line-words">
            {drawing.description.map((line) => (
              <li key={line}>{line}</li>
            ))}
          </ol>
        </details>
      </figcaption>
    </figure>
  );
}
