import type { HTMLAttributes, TdHTMLAttributes, ThHTMLAttributes } from "react";
import { cn } from "@/lib/cn";

/** Plain semantic table pieces with our spacing; scrolls sideways on narrow screens. */
export function Table({ className, caption, children, ...rest }: HTMLAttributes<HTMLTableElement> & { caption?: string }) {
  return (
    <div className="overflow-x-auto">
      <table className={cn("w-full border-collapse text-left text-sm", className)} {...rest}>
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

export const Td = ({ className, ...rest }: TdHTMLAttributes<HTMLTableCellElement>) => (
  <td className={cn("px-5 py-3 text-ink", className)} {...rest} />
);
