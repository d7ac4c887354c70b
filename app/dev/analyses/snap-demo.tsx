"use client";

import { useState } from "react";
import { SnapHelper } from "@/components/editor/snap-helper";

/** The snap helper with a stand-in for the editor: inserted lines collect below it. */
export function SnapDemo() {
  const [text, setText] = useState("");
  return (
    <div className="grid gap-4 md:grid-cols-2">
      <SnapHelper onInsert={(t) => setText((prev) => prev + t)} />
      <pre className="border-paper-200 bg-paper-50 rounded-panel min-h-24 border p-3 font-mono text-sm">
        {text || "# inserted lines appear here"}
      </pre>
    </div>
  );
}
