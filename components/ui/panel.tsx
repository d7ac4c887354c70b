import type { HTMLAttributes, ReactNode } from "react";
import { cn } from "@/lib/utils";

export function Panel({ className, ...props }: HTMLAttributes<HTMLElement>) {
  return (
    <section
      className={cn("rounded-panel border-paper-200 shadow-panel border bg-white", className)}
      {...props}
    />
  );
}

export function PanelHeader({
  title,
  description,
  action,
  id,
}: {
  title: ReactNode;
  description?: ReactNode;
  action?: ReactNode;
  id?: string;
}) {
  return (
    <header className="border-paper-200 flex flex-wrap items-start justify-between gap-3 border-b px-5 py-4">
      <div className="min-w-0">
        <h2 id={id} className="text-ink-900 text-lead font-semibold">
          {title}
        </h2>
        {description ? <p className="text-ink-500 mt-0.5 text-sm">{description}</p> : null}
      </div>
      {action}
    </header>
  );
}

export function PageHeading({
  title,
  lead,
  action,
}: {
  title: ReactNode;
  lead?: ReactNode;
  action?: ReactNode;
}) {
  return (
    <div className="mb-8 flex flex-wrap items-end justify-between gap-4">
      <div>
        <h1 className="text-headline text-ink-950 font-semibold">{title}</h1>
        {lead ? <p className="text-ink-600 mt-1 max-w-2xl">{lead}</p> : null}
      </div>
      {action}
    </div>
  );
}
