type ClassPart = string | false | null | undefined;

/** Joins class names, dropping falsy ones (clsx is not a direct dependency; this is all we need). */
export const cn = (...parts: ClassPart[]) => parts.filter(Boolean).join(" ");
