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
import { useId, useRef, useState, type FormEvent } from "react";
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

type MoveResult = { ok: true } | { ok: false; message: string; needsReason: boolean };
type MoveInput = { dealId: string; stage: Stage; reason: string | null };

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

export function BoardClient({ cards, stallDays }: { cards: BoardCard[]; stallDays: Partial<Record<Stage, number>> }) {
  const { items, notice, setNotice, move } = useBoardMoves(cards);
  const [activeId, setActiveId] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [ask, setAsk] = useState<{ deal: BoardCard; to: Stage; message: string } | null>(null);

  const sensors = useSensors(
    useSensor(PointerSensor, { activationConstraint: { distance: 6 } }),
    useSensor(KeyboardSensor, { coordinateGetter: columnKeyboardCoordinates }),
  );
  const byId = new Map(items.map((c) => [c.id, c]));
  const active = activeId ? byId.get(activeId) : undefined;
  const nameOf = (id: unknown) => byId.get(String(id))?.householdName ?? "The deal";

  function onDragStart(event: DragStartEvent) {
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
    if (result.ok) return;
    if (result.needsReason) setAsk({ deal, to, message: result.message });
    else setError(result.message);
  }

  return (
    <>
      <BoardMessages error={error} notice={notice} />
      <DndContext
        id="board"
        sensors={sensors}
        collisionDetection={collision}
        onDragStart={onDragStart}
        onDragEnd={onDragEnd}
        onDragCancel={() => setActiveId(null)}
        accessibility={{
          announcements: boardAnnouncements(nameOf),
          screenReaderInstructions: {
            draggable: "To move this deal, press Space to pick it up, use the arrow keys to change the column, then Space to drop it or Escape to cancel.",
          },
        }}
      >
        <ScrollRegion label="Pipeline columns" className="mt-2" innerClassName="px-2 pb-4 md:px-4" testId="board-scroller">
          <div className="flex w-max items-start gap-2">
            {COLUMNS.map((stage) => (
              <Column key={stage} stage={stage} side={SIDE_STAGES.includes(stage)} limit={stallDays[stage]} cards={items.filter((c) => c.stage === stage)} />
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
          onCancel={() => setAsk(null)}
          onSubmit={async (reason) => {
            const result = await move(ask.deal, ask.to, reason);
            if (result.ok) setAsk(null);
            return result.ok ? null : result.message;
          }}
        />
      ) : null}
    </>
  );
}

function Column({ stage, side, limit, cards }: { stage: Stage; side: boolean; limit?: number; cards: BoardCard[] }) {
  const { setNodeRef, isOver } = useDroppable({ id: stage });
  const headingId = useId();
  return (
    <section
      ref={setNodeRef}
      aria-labelledby={headingId}
      data-stage={stage}
      className={`flex shrink-0 flex-col rounded-card border ${side ? "w-36 bg-paper-deep/60" : "w-44 bg-paper-deep"} ${
        isOver ? "border-copper ring-2 ring-copper/40" : "border-paper-line"
      }`}
    >
      <header className="flex items-baseline justify-between gap-1 border-b border-paper-line px-2 py-1.5">
        <h2 id={headingId} className="truncate text-xs font-semibold uppercase tracking-wide text-graphite-soft">
          {STAGE_LABELS[stage]}
        </h2>
        <span className="figure text-xs text-graphite-soft" aria-label={`${cards.length} deals`}>
          {cards.length}
        </span>
      </header>
      {limit ? <p className="px-2 pt-1 text-[11px] text-graphite-faint">Flag after {limit} days</p> : null}
      <ul className="flex min-h-32 flex-col gap-1.5 p-1.5">
        {cards.map((c) => (
          <li key={c.id}>
            <DraggableCard card={c} />
          </li>
        ))}
      </ul>
    </section>
  );
}

function DraggableCard({ card }: { card: BoardCard }) {
  const { setNodeRef, setActivatorNodeRef, attributes, listeners, isDragging } = useDraggable({ id: card.id, data: { stage: card.stage } });
  return (
    <div
      ref={(node) => {
        setNodeRef(node);
        setActivatorNodeRef(node);
      }}
      {...attributes}
      {...listeners}
      aria-roledescription="movable deal"
      aria-label={`${card.householdName}, ${STAGE_LABELS[card.stage]}, ${card.daysInStage} days in stage${card.stalled ? ", stalled" : ""}`}
      data-testid="board-card"
      className={`cursor-grab touch-none rounded-md focus:outline-none focus-visible:ring-2 focus-visible:ring-copper ${isDragging ? "opacity-40" : ""}`}
    >
      <CardBody card={card} />
    </div>
  );
}

function CardBody({ card, overlay = false }: { card: BoardCard; overlay?: boolean }) {
  return (
    <article className={`rounded-md border bg-white px-2 py-1.5 text-xs shadow-card ${card.stalled ? "border-caution" : "border-paper-line"} ${overlay ? "w-44 cursor-grabbing" : ""}`}>
      <p className="truncate text-sm font-medium">
        {overlay ? (
          card.householdName
        ) : (
          <Link href={`/deals/${card.id}`} className="underline-offset-2 hover:text-copper hover:underline" draggable={false}>
            {card.householdName}
          </Link>
        )}
      </p>
      <p className="mt-0.5 flex justify-between gap-1 text-graphite-soft">
        <span className="figure">{formatKwFromWatts(card.systemDcWatts)}</span>
        <span className="figure">{formatCents(card.contractCents)}</span>
      </p>
      <p className="mt-0.5 flex justify-between gap-1 text-graphite-soft">
        <span className="truncate">{card.ownerName ?? "No owner"}</span>
        <span className={card.stalled ? "font-semibold text-caution" : ""}>
          <span className="figure">{card.daysInStage}</span> d
        </span>
      </p>
      {card.stalled ? <p className="mt-1 rounded-sm bg-caution-light px-1 py-0.5 font-medium text-caution">Stalled</p> : null}
    </article>
  );
}

function ReasonDialog({
  title,
  message,
  onCancel,
  onSubmit,
}: {
  title: string;
  message: string;
  onCancel: () => void;
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
    setFailure(await onSubmit(reason.trim()));
    setPending(false);
  }

  return (
    <Dialog title={title} description={message} onClose={onCancel}>
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
          <button type="button" className="btn-quiet" onClick={onCancel}>
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
