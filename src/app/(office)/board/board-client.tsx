"use client";

import {
  DndContext,
  DragOverlay,
  KeyboardSensor,
  PointerSensor,
  pointerWithin,
  rectIntersection,
  useDraggable,
  useDroppable,
  useSensor,
  useSensors,
  type Announcements,
  type CollisionDetection,
  type DragEndEvent,
  type DragStartEvent,
  type KeyboardCoordinateGetter,
} from "@dnd-kit/core";
import Link from "next/link";
import { ScrollRegion } from "@/components/ui/scroll-region";
import { useEffect, useId, useRef, useState, type FormEvent, type MouseEvent } from "react";
import { Dialog } from "@/components/ui/dialog";
import { useSave } from "@/components/ui/use-save";
import type { Stage } from "@/lib/enums";
import { formatCents, formatKwFromWatts } from "@/lib/format";
import { PIPELINE, SIDE_STAGES } from "@/lib/stage-rules";
import { STAGE_LABELS } from "@/lib/stages";

export type BoardCard = {
  id: string;
  stage: Stage;
  householdName: string;
  city: string;
  systemDcWatts: number | null;
  contractCents: number | null;
  daysInStage: number;
  stalled: boolean;
  ownerName: string | null;
};

const COLUMNS: readonly Stage[] = [...PIPELINE, ...SIDE_STAGES];
const CARD_KEYS = { start: ["Space"], cancel: ["Escape"], end: ["Space", "Tab"] };
const columnId = (stage: Stage) => `board-column-${stage}`;

type MoveResult = { ok: true } | { ok: false; message: string; needsReason: boolean };
type MoveInput = { dealId: string; stage: Stage; reason: string | null };
const refusalOf = (result: MoveResult) => (result.ok ? null : result.message);

/**
 * A move through the stage route (useSave); the answer says whether it went, and when the rules
 * refused it, their message and whether a reason would let it pass (the 422's `reason` field).
 */
function useStageMove(): (input: MoveInput) => Promise<MoveResult> {
  const refusal = useRef({ message: "", needsReason: false });
  const save = useSave<MoveInput>({
    request: ({ dealId, stage, reason }) => ({ url: `/api/deals/${dealId}/stage`, method: "PATCH", json: { stage, reason } }),
    refresh: false,
    notify: (n) => {
      if (n?.tone === "error") refusal.current.message = n.text;
    },
    onFieldErrors: (fields) => {
      refusal.current.needsReason = Boolean(fields.reason);
    },
  });
  return async (input) => {
    refusal.current = { message: "The move did not go through. Try again.", needsReason: false };
    return (await save.saveAndWait(input)) ? { ok: true } : { ok: false, ...refusal.current };
  };
}

/** Arrow keys jump a picked-up card to the neighbouring column (left/right, also up/down). */
const columnKeyboardCoordinates: KeyboardCoordinateGetter = (event, { context }) => {
  const step = event.code === "ArrowRight" || event.code === "ArrowDown" ? 1 : event.code === "ArrowLeft" || event.code === "ArrowUp" ? -1 : 0;
  if (step === 0) return undefined;
  event.preventDefault();
  const current = (context.over?.id as Stage | undefined) ?? (context.active?.data.current?.stage as Stage | undefined);
  const index = current ? COLUMNS.indexOf(current) : -1;
  const next = COLUMNS[Math.min(COLUMNS.length - 1, Math.max(0, index + step))];
  const rect = context.droppableRects.get(next);
  if (!rect) return undefined;
  return { x: rect.left + 6, y: rect.top + 44 };
};

// Pointer inside a column wins; the keyboard (no pointer) falls back to overlap.
const collision: CollisionDetection = (args) => {
  const hits = pointerWithin(args);
  return hits.length > 0 ? hits : rectIntersection(args);
};

/** What a screen reader hears while a card is picked up, moved and dropped. */
function boardAnnouncements(nameOf: (id: unknown) => string): Announcements {
  return {
    onDragStart: ({ active: a }) => `Picked up ${nameOf(a.id)}. Arrow keys change the column; Space drops it, Escape cancels.`,
    onDragOver: ({ active: a, over }) => (over ? `${nameOf(a.id)} is over ${STAGE_LABELS[over.id as Stage]}.` : `${nameOf(a.id)} is not over a column.`),
    onDragEnd: ({ active: a, over }) => (over ? `${nameOf(a.id)} dropped on ${STAGE_LABELS[over.id as Stage]}.` : `${nameOf(a.id)} put back.`),
    onDragCancel: ({ active: a }) => `Move cancelled; ${nameOf(a.id)} stays where it was.`,
  };
}

/**
 * The cards as shown, and a move that shows the card in its new column at once, then keeps it
 * there (counting its days afresh) or puts it back, as the server decides.
 */
function useBoardMoves(cards: BoardCard[]) {
  const [items, setItems] = useState(cards);
  const [notice, setNotice] = useState<string | null>(null);
  const requestMove = useStageMove();

  function place(dealId: string, stage: Stage, moved: boolean) {
    setItems((prev) => prev.map((c) => (c.id === dealId ? { ...c, stage, ...(moved ? { daysInStage: 0, stalled: false } : {}) } : c)));
  }

  async function move(deal: BoardCard, to: Stage, reason: string | null): Promise<MoveResult> {
    place(deal.id, to, false); // shown in the new column while the server decides
    const result = await requestMove({ dealId: deal.id, stage: to, reason });
    if (result.ok) {
      place(deal.id, to, true);
      setNotice(`${deal.householdName} moved to ${STAGE_LABELS[to]}.`);
    } else {
      place(deal.id, deal.stage, false); // back to its column
    }
    return result;
  }
  return { items, notice, setNotice, move };
}

function BoardMessages({ error, notice }: { error: string | null; notice: string | null }) {
  return (
    <div className="mt-3 min-h-6 px-2 md:px-4">
      {error ? (
        <p role="alert" className="rounded-md border border-danger/30 bg-danger-light px-3 py-2 text-sm text-danger">
          {error}
        </p>
      ) : null}
      <p role="status" data-testid="board-notice" className="text-sm text-sage">
        {notice}
      </p>
    </div>
  );
}

/**
 * Which side columns (On hold, Lost, Cancelled) are open: closed by default, so a long Lost
 * pile never buries the pipeline; each person's choice is kept in this browser.
 */
function useOpenSideStages(userId: string) {
  const key = `kilowright:board:open-side:${userId}`;
  const [open, setOpen] = useState<Stage[]>([]);
  useEffect(() => {
    try {
      const saved: unknown = JSON.parse(localStorage.getItem(key) ?? "[]");
      if (Array.isArray(saved)) setOpen(SIDE_STAGES.filter((s) => saved.includes(s)));
    } catch {
      // A stored value we cannot read: start closed.
    }
  }, [key]);
  function setStageOpen(stage: Stage, value: boolean) {
    setOpen((prev) => {
      const next = value ? [...new Set([...prev, stage])] : prev.filter((s) => s !== stage);
      localStorage.setItem(key, JSON.stringify(next));
      return next;
    });
  }
  return { open, setStageOpen };
}

/**
 * Focus follows a card through a move: dropped, put back after a refusal, or after the reason
 * dialog closes, the card is a new element in its column, so focus is placed on it again
 * (WCAG 2.4.3); a card in a closed column gives its column the focus.
 */
function useCardFocus(items: BoardCard[]) {
  const [target, setTarget] = useState<string | null>(null);
  useEffect(() => {
    if (!target) return;
    const card = document.querySelector<HTMLElement>(`[data-card-id="${target}"]`);
    const stage = items.find((c) => c.id === target)?.stage;
    (card ?? (stage ? document.getElementById(columnId(stage)) : null))?.focus();
    setTarget(null);
  }, [target, items]);
  return setTarget;
}

/**
 * A pointer drag that ends over its own card must not also follow the card's link: the click
 * that ends the drag is stopped by dnd-kit before React sees it, so its default is cancelled here.
 */
function guardClickAfterPointerDrag(event: DragStartEvent) {
  if (!(event.activatorEvent instanceof PointerEvent)) return;
  const cancel = (e: Event) => e.preventDefault();
  window.addEventListener("click", cancel, { capture: true });
  const release = () => setTimeout(() => window.removeEventListener("click", cancel, { capture: true }), 0);
  window.addEventListener("pointerup", release, { capture: true, once: true });
  window.addEventListener("pointercancel", release, { capture: true, once: true });
}

const KEYBOARD_HELP = "To move this deal, press Space to pick it up, use the arrow keys to change the column, then Space to drop it or Escape to cancel. Enter opens the deal.";

export function BoardClient({ cards, stallDays, userId }: { cards: BoardCard[]; stallDays: Partial<Record<Stage, number>>; userId: string }) {
  const { items, notice, setNotice, move } = useBoardMoves(cards);
  const [activeId, setActiveId] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [ask, setAsk] = useState<{ deal: BoardCard; to: Stage; message: string } | null>(null);
  const side = useOpenSideStages(userId);
  const focusCard = useCardFocus(items);

  const sensors = useSensors(
    useSensor(PointerSensor, { activationConstraint: { distance: 6 } }),
    // Space picks a card up and drops it; Enter is left to the card's link (it opens the deal).
    useSensor(KeyboardSensor, { coordinateGetter: columnKeyboardCoordinates, keyboardCodes: CARD_KEYS }),
  );
  const byId = new Map(items.map((c) => [c.id, c]));
  const active = activeId ? byId.get(activeId) : undefined;
  const nameOf = (id: unknown) => byId.get(String(id))?.householdName ?? "The deal";

  function onDragStart(event: DragStartEvent) {
    guardClickAfterPointerDrag(event);
    setActiveId(String(event.active.id));
    setError(null);
    setNotice(null);
  }

  async function onDragEnd(event: DragEndEvent) {
    setActiveId(null);
    const deal = byId.get(String(event.active.id));
    const to = event.over?.id as Stage | undefined;
    if (!deal || !to || to === deal.stage) return;
    const result = await move(deal, to, null);
    if (!result.ok && result.needsReason) return setAsk({ deal, to, message: result.message });
    if (!result.ok) setError(result.message);
    focusCard(deal.id);
  }

  return (
    <>
      <StageOverview cards={items} onGo={(stage) => goToColumn(stage, side)} />
      <BoardMessages error={error} notice={notice} />
      <DndContext
        id="board"
        sensors={sensors}
        collisionDetection={collision}
        onDragStart={onDragStart}
        onDragEnd={onDragEnd}
        onDragCancel={() => setActiveId(null)}
        accessibility={{ announcements: boardAnnouncements(nameOf), screenReaderInstructions: { draggable: KEYBOARD_HELP } }}
      >
        <ScrollRegion label="Pipeline columns" className="mt-2" innerClassName="px-2 pb-4 md:px-4" testId="board-scroller">
          <div className="flex w-max items-start gap-2">
            {COLUMNS.map((stage) => (
              <Column
                key={stage}
                stage={stage}
                limit={stallDays[stage]}
                cards={items.filter((c) => c.stage === stage)}
                open={!SIDE_STAGES.includes(stage) || side.open.includes(stage)}
                onToggle={SIDE_STAGES.includes(stage) ? (value) => side.setStageOpen(stage, value) : undefined}
              />
            ))}
          </div>
        </ScrollRegion>
        <DragOverlay dropAnimation={null}>{active ? <CardBody card={active} overlay /> : null}</DragOverlay>
      </DndContext>
      {ask ? (
        <ReasonDialog
          key={`${ask.deal.id}-${ask.to}`}
          title={`Move ${ask.deal.householdName} to ${STAGE_LABELS[ask.to]}`}
          message={ask.message}
          onClose={() => {
            setAsk(null);
            focusCard(ask.deal.id);
          }}
          onSubmit={async (reason) => refusalOf(await move(ask.deal, ask.to, reason))}
        />
      ) : null}
    </>
  );
}

/** Opens a closed side column if need be, scrolls the board to the column and gives it the focus. */
function goToColumn(stage: Stage, side: ReturnType<typeof useOpenSideStages>) {
  if (SIDE_STAGES.includes(stage) && !side.open.includes(stage)) side.setStageOpen(stage, true);
  requestAnimationFrame(() => {
    const column = document.getElementById(columnId(stage));
    if (!column) return;
    column.scrollIntoView({ block: "nearest", inline: "start" });
    column.focus({ preventScroll: true });
  });
}

/** Every stage with its count, in one short row: the whole pipeline at a glance, each a jump to its column. */
function StageOverview({ cards, onGo }: { cards: BoardCard[]; onGo: (stage: Stage) => void }) {
  const count = (stage: Stage) => cards.filter((c) => c.stage === stage).length;
  const item = (stage: Stage) => (
    <li key={stage}>
      <a
        href={`#${columnId(stage)}`}
        onClick={(e: MouseEvent) => {
          e.preventDefault();
          onGo(stage);
        }}
        className="inline-flex min-h-8 items-center gap-1.5 rounded-md border border-paper-line bg-white px-2 text-sm hover:border-copper"
      >
        {STAGE_LABELS[stage]}{" "}
        <span className="figure font-semibold">
          {count(stage)}
          <span className="sr-only"> deals</span>
        </span>
      </a>
    </li>
  );
  return (
    <nav aria-label="Stages" className="mt-3 px-2 md:px-4" data-testid="board-overview">
      <ol className="flex flex-wrap items-center gap-1">
        {PIPELINE.map(item)}
        <li aria-hidden="true" className="mx-1 h-6 w-px bg-paper-line" />
        {SIDE_STAGES.map(item)}
      </ol>
    </nav>
  );
}

function Column({ stage, limit, cards, open, onToggle }: { stage: Stage; limit?: number; cards: BoardCard[]; open: boolean; onToggle?: (open: boolean) => void }) {
  const { setNodeRef, isOver } = useDroppable({ id: stage });
  const headingId = useId();
  const listId = useId();
  return (
    <section
      ref={setNodeRef}
      id={columnId(stage)}
      tabIndex={-1}
      aria-labelledby={headingId}
      data-stage={stage}
      className={`flex shrink-0 flex-col rounded-card border ${onToggle ? "w-36 bg-paper-deep/60" : "w-44 bg-paper-deep"} ${
        isOver ? "border-copper ring-2 ring-copper/40" : "border-paper-line"
      }`}
    >
      <header className="flex items-baseline justify-between gap-1 border-b border-paper-line px-2 py-1.5">
        <h2 id={headingId} className="truncate text-xs font-semibold uppercase tracking-wide text-graphite-soft">
          {STAGE_LABELS[stage]}
        </h2>
        <span className="figure text-xs text-graphite-soft">
          {cards.length}
          <span className="sr-only"> deals</span>
        </span>
      </header>
      {limit ? <p className="px-2 pt-1 text-xs text-graphite-soft">Flag after {limit} days</p> : null}
      {onToggle ? (
        <button type="button" aria-expanded={open} aria-controls={listId} onClick={() => onToggle(!open)} className="mx-1.5 mt-1.5 min-h-8 rounded-md border border-paper-line bg-white px-2 text-left text-xs font-medium hover:border-copper">
          {open ? "Hide the cards" : `Show ${cards.length} ${cards.length === 1 ? "card" : "cards"}`}
        </button>
      ) : null}
      <ul id={listId} hidden={!open} className={`flex flex-col gap-1.5 p-1.5 ${onToggle ? "max-h-[70vh] overflow-y-auto" : "min-h-32"}`}>
        {open
          ? cards.map((c) => (
              <li key={c.id}>
                <DraggableCard card={c} />
              </li>
            ))
          : null}
      </ul>
      {open ? null : <div className="min-h-16" aria-hidden="true" />}
    </section>
  );
}

/**
 * A card is one element: the link to its deal, which is also what a pointer drags and what
 * Space picks up. Its name is its visible text (WCAG 2.5.3); how to move it is its description.
 */
function DraggableCard({ card }: { card: BoardCard }) {
  const { setNodeRef, attributes, listeners, isDragging } = useDraggable({ id: card.id, data: { stage: card.stage } });
  return (
    <Link
      ref={setNodeRef}
      href={`/deals/${card.id}`}
      {...listeners}
      aria-describedby={attributes["aria-describedby"]}
      draggable={false}
      data-testid="board-card"
      data-card-id={card.id}
      className={`block cursor-grab touch-none rounded-md focus:outline-none focus-visible:ring-2 focus-visible:ring-copper ${isDragging ? "opacity-40" : ""}`}
    >
      <CardBody card={card} />
    </Link>
  );
}

function CardBody({ card, overlay = false }: { card: BoardCard; overlay?: boolean }) {
  return (
    <span className={`block rounded-md border bg-white px-2 py-1.5 text-xs shadow-card ${card.stalled ? "border-caution" : "border-paper-line"} ${overlay ? "w-44 cursor-grabbing" : "hover:border-copper"}`}>
      <span className="block truncate text-sm font-medium">{card.householdName}</span>
      <span className="mt-0.5 flex justify-between gap-1 text-graphite-soft">
        <span className="figure">{formatKwFromWatts(card.systemDcWatts)}</span>
        <span className="figure">{formatCents(card.contractCents)}</span>
      </span>
      <span className="mt-0.5 flex justify-between gap-1 text-graphite-soft">
        <span className="truncate">{card.ownerName ?? "No owner"}</span>
        <span className={`shrink-0 ${card.stalled ? "font-semibold text-caution" : ""}`}>
          <span className="figure">{card.daysInStage}</span> {card.daysInStage === 1 ? "day" : "days"}
        </span>
      </span>
      {card.stalled ? <span className="mt-1 block rounded-sm bg-caution-light px-1 py-0.5 font-medium text-caution">Stalled</span> : null}
    </span>
  );
}

/** Asks for the reason the rules want; closes (onClose) on Cancel, Escape or a move that went through. */
function ReasonDialog({
  title,
  message,
  onClose,
  onSubmit,
}: {
  title: string;
  message: string;
  onClose: () => void;
  onSubmit: (reason: string) => Promise<string | null>;
}) {
  const fieldId = useId();
  const [reason, setReason] = useState("");
  const [failure, setFailure] = useState<string | null>(null);
  const [pending, setPending] = useState(false);

  async function submit(event: FormEvent) {
    event.preventDefault();
    if (!reason.trim()) {
      setFailure("Write the reason first.");
      return;
    }
    setPending(true);
    const refused = await onSubmit(reason.trim());
    setPending(false);
    if (refused) setFailure(refused);
    else onClose();
  }

  return (
    <Dialog title={title} description={message} onClose={onClose}>
      <form onSubmit={submit}>
        <label htmlFor={fieldId} className="field-label mt-4">
          Reason
        </label>
        <textarea
          id={fieldId}
          autoFocus
          value={reason}
          maxLength={300}
          rows={3}
          onChange={(e) => setReason(e.target.value)}
          aria-invalid={failure ? true : undefined}
          className="field-input py-2"
        />
        {failure ? (
          <p role="alert" className="field-error">
            {failure}
          </p>
        ) : null}
        <div className="mt-4 flex justify-end gap-2">
          <button type="button" className="btn-quiet" onClick={onClose}>
            Cancel
          </button>
          <button type="submit" className="btn-primary" disabled={pending}>
            {pending ? "Moving…" : "Move deal"}
          </button>
        </div>
      </form>
    </Dialog>
  );
}
