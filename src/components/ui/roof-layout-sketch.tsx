"use client";
import { useId, useState } from "react";
import { sketchText, type FaceSketch } from "@/lib/job-materials";
import { ScrollRegion } from "./scroll-region";

const ZOOMS = [1, 2, 3] as const;
/** Centimetres per SVG unit: the drawing is in metres × 100. */
const S = 100;
const pts = (p: { x: number; y: number }[], slopeM: number) => p.map((q) => `${(q.x * S).toFixed(1)},${((slopeM - q.y) * S).toFixed(1)}`).join(" ");

/**
 * One roof face drawn to scale (eave at the bottom): outline, pathways and setbacks hatched,
 * modules in their rows. On a phone it zooms (buttons) and scrolls inside its own region; the
 * paragraph under it says the same in words.
 */
export function RoofLayoutSketch({ face }: { face: FaceSketch }) {
  const [zoom, setZoom] = useState<(typeof ZOOMS)[number]>(1);
  const textId = useId();
  const hatch = useId().replace(/:/g, "");
  const l = face.layout;
  if (!l) return <p className="text-sm text-graphite-soft">{sketchText(face)}</p>;
  const pad = 60;
  const w = l.eaveM * S;
  const h = l.slopeM * S;
  return (
    <figure className="space-y-2" data-testid="roof-sketch">
      <div className="flex flex-wrap items-center gap-2">
        <span className="text-sm text-graphite-soft" id={`${textId}-zoom`}>
          Zoom
        </span>
        {ZOOMS.map((z) => (
          <button key={z} type="button" className={z === zoom ? "btn-primary min-h-touch px-3" : "btn-quiet min-h-touch px-3"} aria-pressed={z === zoom} aria-describedby={`${textId}-zoom`} onClick={() => setZoom(z)}>
            {z}×
          </button>
        ))}
      </div>
      <ScrollRegion label={`Roof layout of ${face.name}`} tone="white" innerClassName="rounded-card border border-paper-line bg-white">
        <svg
          viewBox={`${-pad} ${-pad} ${w + 2 * pad} ${h + 2 * pad}`}
          role="img"
          aria-labelledby={`${textId}-title`}
          aria-describedby={textId}
          style={{ width: `${zoom * 100}%`, minWidth: zoom === 1 ? undefined : `${zoom * 18}rem` }}
          className="block h-auto max-w-none"
          data-zoom={zoom}
        >
          <title id={`${textId}-title`}>{`Roof layout of ${face.name}`}</title>
          <defs>
            <pattern id={hatch} width="16" height="16" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
              <rect width="16" height="16" className="fill-caution-light" />
              <line x1="0" y1="0" x2="0" y2="16" className="stroke-caution" strokeWidth="3" />
            </pattern>
          </defs>
          <polygon points={pts(l.outline, l.slopeM)} className="fill-paper stroke-graphite" strokeWidth="4" />
          {l.keepClear.map((k, i) => (
            <polygon key={i} points={pts(k.polygon, l.slopeM)} fill={`url(#${hatch})`} className="stroke-caution" strokeWidth="2" data-keep-clear={k.kind} />
          ))}
          {l.modules.map((m, i) => (
            <rect key={i} x={m.x * S} y={(l.slopeM - m.y - m.h) * S} width={m.w * S} height={m.h * S} className="fill-slate-light stroke-usage" strokeWidth="3" data-module={m.row} />
          ))}
          <text x={w / 2} y={h + 40} textAnchor="middle" className="fill-graphite" fontSize="32">{`Eave ${l.eaveM} m`}</text>
          <text x={w / 2} y={-20} textAnchor="middle" className="fill-graphite" fontSize="32">Ridge</text>
        </svg>
      </ScrollRegion>
      <figcaption id={textId} className="text-sm" data-testid="roof-sketch-text">
        {sketchText(face)}
      </figcaption>
    </figure>
  );
}
