"use client";
import { useEffect, useRef, useState, type ReactNode } from "react";

/** Which sides of a sideways-scrolling box hide more content. */
export function useScrollEdges<T extends HTMLElement>() {
  const ref = useRef<T>(null);
  const [edges, setEdges] = useState({ start: false, end: false });
  useEffect(() => {
    const el = ref.current;
    if (!el) return;
    const measure = () => {
      const max = el.scrollWidth - el.clientWidth;
      setEdges({ start: el.scrollLeft > 1, end: max - el.scrollLeft > 1 });
    };
    measure();
    el.addEventListener("scroll", measure, { passive: true });
    const observer = new ResizeObserver(measure);
    observer.observe(el);
    for (const child of el.children) observer.observe(child);
    return () => {
      el.removeEventListener("scroll", measure);
      observer.disconnect();
    };
  }, []);
  return { ref, edges };
}

/** A fade over the side of a scroll box that hides more, with an arrow (the visible cue). */
export function ScrollCue({ side, show, tone = "paper" }: { side: "start" | "end"; show: boolean; tone?: "paper" | "white" }) {
  if (!show) return null;
  const from = tone === "white" ? "from-white" : "from-paper";
  return (
    <div
      aria-hidden="true"
      data-scroll-cue={side}
      className={`pointer-events-none absolute inset-y-0 z-10 flex w-10 items-center ${
        side === "start" ? `left-0 justify-start bg-gradient-to-r ${from} to-transparent pl-1` : `right-0 justify-end bg-gradient-to-l ${from} to-transparent pr-1`
      }`}
    >
      <span className="rounded-full bg-graphite px-1.5 text-xs leading-5 text-white shadow-card">{side === "start" ? "←" : "→"}</span>
    </div>
  );
}

/**
 * A region made to scroll sideways (the Board's columns, deal tabs): it says so with a fade and
 * an arrow on each side that hides more, and it is marked `data-scroll-region` (the browser test
 * that forbids sideways scrolling accepts it only with its cue showing). Focusable, so the
 * keyboard can scroll it.
 */
export function ScrollRegion({ label, className, innerClassName, testId, tone, children }: { label: string; className?: string; innerClassName?: string; testId?: string; tone?: "paper" | "white"; children: ReactNode }) {
  const { ref, edges } = useScrollEdges<HTMLDivElement>();
  return (
    <div className={`relative min-w-0 ${className ?? ""}`} data-scroll-region={label}>
      {/* `relative`: absolutely placed content inside (screen-reader-only text) is clipped by this box, not placed against the page, where it would widen it. */}
      <div ref={ref} role="region" aria-label={label} tabIndex={0} className={`relative overflow-x-auto ${innerClassName ?? ""}`} data-testid={testId}>
        {children}
      </div>
      <ScrollCue side="start" show={edges.start} tone={tone} />
      <ScrollCue side="end" show={edges.end} tone={tone} />
    </div>
  );
}
