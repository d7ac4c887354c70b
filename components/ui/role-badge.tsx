import type { Role } from "@/lib/roles";
import { cn } from "@/lib/utils";

const STYLES: Record<Role, string> = {
  owner: "bg-copper-100 text-copper-700",
  designer: "bg-board-100 text-board-800",
  reviewer: "bg-paper-200 text-ink-800",
  viewer: "bg-paper-100 text-ink-600 ring-1 ring-paper-300 ring-inset",
};

export function RoleBadge({ role, className }: { role: Role; className?: string }) {
  return (
    <span
      className={cn(
        "text-caption inline-flex items-center rounded-full px-2 py-0.5 font-medium",
        STYLES[role],
        className,
      )}
    >
      {role}
    </span>
  );
}
