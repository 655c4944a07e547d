// Shared presentational pieces. Feature code imports from "@/components/ui".
export { Alert } from "./Alert";
export { Badge, type BadgeTone } from "./Badge";
export { Button, ButtonLink, buttonClasses, type ButtonProps, type ButtonVariant, type ButtonSize } from "./Button";
export { Card } from "./Card";
export { Dialog, ConfirmDialog } from "./Dialog";
export { EmptyState } from "./EmptyState";
export { Field } from "./Field";
export { Input, Select, Textarea } from "./Input";
export { Menu, MenuItem, MenuLabel, MenuSeparator } from "./Menu";
export { PageHeader } from "./PageHeader";
export { Spinner, PageSpinner } from "./Spinner";
export { Table, THead, TBody, Tr, Th, Td } from "./Table";
export { Toaster, toast } from "./Toast";
export { LoadError } from "./LoadError";
export { Pager } from "./Pager";
