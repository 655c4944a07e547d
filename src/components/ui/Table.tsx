import type { HTMLAttributes, TdHTMLAttributes, ThHTMLAttributes } from "react";
import { cn } from "@/lib/cn";

/**
 * Plain semantic table pieces with our spacing. Below tablet width each row becomes a card
 * (styles.css, `.lf-cards`): the header row hides, and every cell with a `label` shows that label
 * above its value, so nothing is pushed off a phone's screen. `cards={false}` keeps a real grid
 * (scrolling sideways inside its box) where columns must line up, e.g. readings.
 */
export function Table({ className, caption, cards = true, children, ...rest }: HTMLAttributes<HTMLTableElement> & { caption?: string; cards?: boolean }) {
  return (
    <div className="overflow-x-auto">
      <table className={cn("w-full border-collapse text-left text-sm", cards && "lf-cards", className)} {...rest}>
        {caption && <caption className="sr-only">{caption}</caption>}
        {children}
      </table>
    </div>
  );
}

export const THead = ({ className, ...rest }: HTMLAttributes<HTMLTableSectionElement>) => (
  <thead className={cn("bg-sunken/60 text-xs font-semibold tracking-wide text-ink-muted uppercase", className)} {...rest} />
);

export const TBody = ({ className, ...rest }: HTMLAttributes<HTMLTableSectionElement>) => (
  <tbody className={cn("divide-y divide-line", className)} {...rest} />
);

export const Tr = ({ className, ...rest }: HTMLAttributes<HTMLTableRowElement>) => (
  <tr className={cn("align-middle", className)} {...rest} />
);

export const Th = ({ className, scope = "col", ...rest }: ThHTMLAttributes<HTMLTableCellElement>) => (
  <th scope={scope} className={cn("px-5 py-2.5 font-semibold first:pl-5 last:pr-5", className)} {...rest} />
);

interface TdProps extends TdHTMLAttributes<HTMLTableCellElement> {
  /** The column's name, shown above the value when the row is a card (phones). */
  label?: string;
  /** The row's title cell: a full-width line at the top of the card. */
  primary?: boolean;
}

export const Td = ({ className, label, primary, ...rest }: TdProps) => (
  <td data-label={label} data-primary={primary || undefined} className={cn("px-5 py-3 text-ink", className)} {...rest} />
);
