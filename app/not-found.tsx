import Link from "next/link";
import { buttonClass } from "@/components/ui/button-class";

export default function NotFound() {
  return (
    <div className="mx-auto max-w-xl px-4 py-20 text-center sm:px-6">
      <p className="text-caption text-copper-600 font-mono tracking-widest uppercase">404</p>
      <h1 className="text-headline text-ink-950 mt-3 font-semibold">Nothing here</h1>
      <p className="text-ink-600 mt-3">
        This page does not exist, or it belongs to a team you are not a member of.
      </p>
      <Link href="/projects" className={buttonClass({ className: "mt-8" })}>
        Back to projects
      </Link>
    </div>
  );
}
