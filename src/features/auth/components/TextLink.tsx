import { Link, type LinkProps } from "react-router-dom";
import { cn } from "@/lib/cn";

export function TextLink({ className, ...rest }: LinkProps) {
  return <Link className={cn("font-medium text-accent underline-offset-2 hover:text-accent-strong hover:underline", className)} {...rest} />;
}
