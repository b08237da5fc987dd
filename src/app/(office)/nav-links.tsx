"use client";
import Link from "next/link";
import { usePathname } from "next/navigation";
import { useEffect, useRef, useState, type ReactNode } from "react";
import { useModalWhileMounted } from "@/components/ui/dialog";

type Sections = { href: string; label: string }[];

export function NavLinks({ sections, onPick }: { sections: Sections; onPick?: () => void }) {
  const pathname = usePathname();
  return (
    <ul className="flex flex-col gap-1">
      {sections.map((s) => {
        const active = pathname === s.href || pathname.startsWith(`${s.href.split("/").slice(0, 2).join("/")}/`);
        return (
          <li key={s.href}>
            <Link
              href={s.href}
              onClick={onPick}
              aria-current={active ? "page" : undefined}
              className={`flex min-h-touch items-center rounded-md px-3 text-sm font-medium ${
                active ? "bg-white text-copper shadow-card" : "text-graphite hover:bg-white/70"
              }`}
            >
              {s.label}
            </Link>
          </li>
        );
      })}
    </ul>
  );
}

/** Where the side column shows instead of the drawer (Tailwind's `lg`, as in the layout). */
const SIDE_COLUMN = "(min-width: 1024px)";

/**
 * The sections below 1024 px: a Menu button opening them in a drawer on the native modal
 * <dialog> (the browser traps focus, closes on Escape and returns focus to the button). It
 * closes on a pick, on a tap beside it, and when the window grows past the side column's
 * width (a tablet turned sideways), so no drawer is left open behind the side column.
 */
export function NavDrawer({ sections, person, children }: { sections: Sections; person: { name: string; role: string; companyName: string }; children: ReactNode }) {
  const [open, setOpen] = useState(false);
  const button = useRef<HTMLButtonElement>(null);
  const pathname = usePathname();
  // Escape, Close or a tap beside it: back to the Menu button (a pick moves on to its page).
  const close = () => {
    setOpen(false);
    requestAnimationFrame(() => button.current?.focus());
  };
  useEffect(() => setOpen(false), [pathname]);
  useEffect(() => {
    const wide = window.matchMedia(SIDE_COLUMN);
    const onChange = () => {
      if (wide.matches) setOpen(false);
    };
    wide.addEventListener("change", onChange);
    return () => wide.removeEventListener("change", onChange);
  }, []);
  return (
    <>
      <button ref={button} type="button" className="btn-quiet shrink-0" aria-expanded={open} aria-controls="office-nav-drawer" onClick={() => setOpen(true)}>
        <span aria-hidden="true" className="text-lg leading-none">
          ≡
        </span>
        Menu
      </button>
      {open ? (
        <Drawer onClose={close} onPick={() => setOpen(false)} person={person} sections={sections}>
          {children}
        </Drawer>
      ) : null}
    </>
  );
}

type DrawerProps = { sections: Sections; person: { name: string; role: string; companyName: string }; onClose: () => void; onPick: () => void; children: ReactNode };

function Drawer({ sections, person, onClose, onPick, children }: DrawerProps) {
  const ref = useModalWhileMounted();
  return (
    <dialog
      ref={ref}
      id="office-nav-drawer"
      aria-label="Menu"
      onCancel={(e) => {
        e.preventDefault();
        onClose();
      }}
      // A tap on the backdrop lands on the <dialog> itself (its box is the panel, the backdrop is outside it).
      onClick={(e) => {
        if (e.target === e.currentTarget) onClose();
      }}
      className="fixed inset-y-0 left-0 m-0 h-dvh max-h-none w-72 max-w-[85vw] overflow-y-auto border-r border-paper-line bg-paper-deep p-0 text-graphite shadow-card backdrop:bg-graphite/40"
    >
      <div className="flex min-h-full flex-col">
        <div className="flex items-start justify-between gap-2 px-5 pt-4">
          <div className="min-w-0">
            <p className="text-sm font-medium">{person.name}</p>
            <p className="text-xs text-graphite-soft">{person.role}</p>
            <p className="truncate text-xs text-graphite-soft">{person.companyName}</p>
          </div>
          <button type="button" className="btn-quiet shrink-0" onClick={onClose}>
            Close
          </button>
        </div>
        <nav aria-label="Sections" className="mt-4 px-3">
          <NavLinks sections={sections} onPick={onPick} />
        </nav>
        <div className="px-5 pb-6 pt-4">{children}</div>
      </div>
    </dialog>
  );
}
