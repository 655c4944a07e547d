import { createContext, useContext, useEffect, useId, useRef, useState, type ReactNode } from "react";
import { cn } from "@/lib/cn";

// A small dropdown menu following the WAI-ARIA menu button pattern: the trigger has
// aria-haspopup/aria-expanded, arrow keys move between items, Esc returns focus to the trigger.

const CloseCtx = createContext<() => void>(() => {});

interface MenuProps {
  /** The trigger's content (text, avatar…). */
  trigger: ReactNode;
  /** Accessible name of the trigger when its content is not enough. */
  triggerLabel?: string;
  triggerClassName?: string;
  align?: "start" | "end";
  className?: string;
  children: ReactNode;
}

const ITEM = '[role="menuitem"],[role="menuitemradio"],[role="menuitemcheckbox"]';

export function Menu({ trigger, triggerLabel, triggerClassName, align = "start", className, children }: MenuProps) {
  const [open, setOpen] = useState(false);
  const rootRef = useRef<HTMLDivElement>(null);
  const buttonRef = useRef<HTMLButtonElement>(null);
  const panelRef = useRef<HTMLDivElement>(null);
  const menuId = useId();

  const items = () => Array.from(panelRef.current?.querySelectorAll<HTMLElement>(ITEM) ?? []).filter((el) => !el.hasAttribute("disabled"));
  const close = (refocus = true) => {
    setOpen(false);
    if (refocus) buttonRef.current?.focus();
  };

  useEffect(() => {
    if (!open) return;
    const list = items();
    (list.find((el) => el.getAttribute("aria-checked") === "true") ?? list[0])?.focus();
    const onDown = (e: PointerEvent) => {
      if (!rootRef.current?.contains(e.target as Node)) setOpen(false);
    };
    document.addEventListener("pointerdown", onDown);
    return () => document.removeEventListener("pointerdown", onDown);
  }, [open]);

  const onKeyDown = (e: React.KeyboardEvent) => {
    const list = items();
    const at = list.indexOf(document.activeElement as HTMLElement);
    const move = (i: number) => list[(i + list.length) % list.length]?.focus();
    if (e.key === "Tab") return setOpen(false);
    const action: Record<string, () => void> = {
      ArrowDown: () => move(at + 1),
      ArrowUp: () => move(at - 1),
      Home: () => move(0),
      End: () => move(list.length - 1),
      Escape: close,
    };
    const run = action[e.key];
    if (!run) return;
    e.preventDefault();
    run();
  };

  return (
    <div ref={rootRef} className={cn("relative", className)}>
      <button
        ref={buttonRef}
        type="button"
        aria-haspopup="menu"
        aria-expanded={open}
        aria-controls={open ? menuId : undefined}
        aria-label={triggerLabel}
        onClick={() => setOpen((o) => !o)}
        onKeyDown={(e) => {
          if (e.key === "ArrowDown" && !open) { e.preventDefault(); setOpen(true); }
        }}
        className={triggerClassName}
      >
        {trigger}
      </button>
      {open && (
        <div
          ref={panelRef}
          id={menuId}
          role="menu"
          onKeyDown={onKeyDown}
          className={cn(
            "absolute top-full z-40 mt-2 min-w-64 rounded-xl border border-line bg-surface p-1.5 text-ink shadow-[var(--shadow-pop)]",
            align === "end" ? "right-0" : "left-0",
          )}
        >
          <CloseCtx.Provider value={() => close()}>{children}</CloseCtx.Provider>
        </div>
      )}
    </div>
  );
}

interface MenuItemProps {
  onSelect: () => void;
  /** Given for a choice among several (menuitemradio): marks the current one. */
  checked?: boolean;
  disabled?: boolean;
  /** Keep the menu open after selecting (e.g. a toggle). */
  keepOpen?: boolean;
  tone?: "default" | "danger";
  children: ReactNode;
}

export function MenuItem({ onSelect, checked, disabled, keepOpen = false, tone = "default", children }: MenuItemProps) {
  const close = useContext(CloseCtx);
  const radio = checked !== undefined;
  return (
    <button
      type="button"
      role={radio ? "menuitemradio" : "menuitem"}
      aria-checked={radio ? checked : undefined}
      disabled={disabled}
      tabIndex={-1}
      onClick={() => {
        onSelect();
        if (!keepOpen) close();
      }}
      className={cn(
        "flex w-full items-center gap-3 rounded-lg px-3 py-2 text-left text-sm outline-none",
        "hover:bg-sunken focus-visible:bg-accent-soft focus-visible:outline-none disabled:opacity-50",
        tone === "danger" ? "text-danger" : "text-ink",
      )}
    >
      {radio && (
        <span aria-hidden className={cn("flex size-4 shrink-0 items-center justify-center rounded-full border", checked ? "border-accent bg-accent" : "border-line-strong")}>
          {checked && <span className="size-1.5 rounded-full bg-white" />}
        </span>
      )}
      <span className="min-w-0 flex-1">{children}</span>
    </button>
  );
}

export function MenuLabel({ children }: { children: ReactNode }) {
  return <div className="px-3 pt-2 pb-1 text-xs font-semibold tracking-wide text-ink-faint uppercase">{children}</div>;
}

export function MenuSeparator() {
  return <div role="separator" className="my-1.5 h-px bg-line" />;
}
