"use client";

import { useCallback, useEffect, useMemo, useRef, useState } from "react";
import { BodePlot } from "@/components/plot/bode-plot";
import type { BodeMarker, BodeOverlay } from "@/components/plot/types";
import { variantOverlays } from "@/components/plot/variants";
import { PlainButton } from "@/components/ui/button";
import { MAX_NETLIST_BYTES } from "@/lib/limits";
import { freePairNames } from "@/lib/snap-pairs";
import type { NetlistError, Warning } from "@/solver/types";
import { CodeEditor, type CodeEditorHandle } from "./code-editor";
import { ExamplePicker, type NetlistExample } from "./example-picker";
import { PreviewPanel } from "./preview-panel";
import { previewView } from "./preview-view";
import { SAVE_RUN_FORM_ID, SaveRunForm } from "./save-run-form";
import { SnapHelper } from "./snap-helper";
import { type PreviewAnswer, useLiveSolve } from "./use-live-solve";

export interface NetlistEditorProps {
  projectId: string;
  projectName: string;
  examples: NetlistExample[];
  /** Text to start with when there is no draft (default: the first example). */
  initialNetlist?: string;
  /** Revising a saved run: its netlist is the starting text and the saved run supersedes it. */
  revise?: { id: string; title: string; netlist: string };
  /** The preview of the starting text, solved by the page on the server (no request for it here). */
  initialPreview?: PreviewAnswer | null;
}

// Stable empty values, so a keystroke does not hand the editor and the plot "new" empty lists.
const NO_OVERLAYS: BodeOverlay[] = [];
const NO_ERRORS: NetlistError[] = [];
const NO_WARNINGS: Warning[] = [];

/** The unsaved draft of a project — or of one revision, so revising never picks up another draft. */
const draftKey = (projectId: string, reviseId?: string) =>
  reviseId ? `phasewright:draft:${projectId}:revise:${reviseId}` : `phasewright:draft:${projectId}`;

/** The markers of the previous render while they are the same, value for value. */
function useSameMarkers(markers: BodeMarker[]): BodeMarker[] {
  const kept = useRef<BodeMarker[]>(markers);
  const prev = kept.current;
  const same =
    prev.length === markers.length &&
    prev.every((m, i) => m.frequencyHz === markers[i]!.frequencyHz && m.label === markers[i]!.label);
  if (!same) kept.current = markers;
  return kept.current;
}

/** The editor page's interactive part: netlist text, live preview, upload, examples and "Save run". */
export function NetlistEditor({
  projectId,
  projectName,
  examples,
  initialNetlist,
  revise,
  initialPreview = null,
}: NetlistEditorProps) {
  const [netlist, setNetlist] = useState(revise?.netlist ?? initialNetlist ?? examples[0]?.text ?? "");
  const key = draftKey(projectId, revise?.id);
  const [saveErrors, setSaveErrors] = useState<NetlistError[]>([]);
  const [notice, setNotice] = useState<string | null>(null);
  const [dragging, setDragging] = useState(false);
  const [focusHz, setFocusHz] = useState<number | null>(null);
  const editorRef = useRef<CodeEditorHandle>(null);
  const fileRef = useRef<HTMLInputElement>(null);
  const live = useLiveSolve(netlist, { initial: initialPreview });

  /** Replaces the text from outside the editor (draft, upload, example); undo brings the old text back. */
  const replaceNetlist = useCallback((text: string) => {
    setNetlist(text);
    setSaveErrors([]);
    editorRef.current?.replaceText(text);
  }, []);

  // Keep an unsaved draft per project in this browser, so a reload loses nothing.
  useEffect(() => {
    const draft = window.localStorage.getItem(key);
    if (draft) replaceNetlist(draft);
  }, [key, replaceNetlist]);
  useEffect(() => {
    const t = setTimeout(() => window.localStorage.setItem(key, netlist), 500);
    return () => clearTimeout(t);
  }, [netlist, key]);

  const view = previewView({ ...live, saveErrors });
  const errors = view.kind === "errors" ? view.errors : NO_ERRORS;
  const lastGood = view.kind === "result" ? view.result : null;
  const warnings = lastGood?.warnings ?? NO_WARNINGS;

  // The plot is redrawn only when what it draws changes: markers by value (a new answer with the same
  // measures keeps them), overlays only for a vary family.
  const markers = useSameMarkers(
    (lastGood?.measures ?? [])
      .filter((m) => m.unit === "Hz" && m.value !== null && m.value > 0)
      .map((m) => ({ frequencyHz: m.value as number, label: m.name })),
  );

  const overlays = useMemo<BodeOverlay[]>(
    () => (lastGood?.variants ? variantOverlays(lastGood) : NO_OVERLAYS),
    [lastGood],
  );

  // One element while its data stays the same, so a keystroke (or a status change) re-renders the
  // panel around the plot but never redraws the plot itself.
  const frequencies = lastGood?.frequencies;
  const traces = lastGood?.traces;
  const plot = useMemo(
    () =>
      frequencies && traces ? (
        <BodePlot
          frequencies={frequencies}
          traces={traces}
          markers={markers}
          overlays={overlays}
          focusHz={focusHz}
          plotId="editor-preview"
          exportName="phasewright-preview"
          height={440}
        />
      ) : null,
    [frequencies, traces, markers, overlays, focusHz],
  );

  const onChange = useCallback((text: string) => {
    setNetlist(text);
    setSaveErrors([]);
  }, []);

  async function loadFile(file: File) {
    setNotice(null);
    if (file.size > MAX_NETLIST_BYTES) {
      setNotice(`${file.name} is larger than ${MAX_NETLIST_BYTES / 1000} kB; it was not opened.`);
      return;
    }
    const text = await file.text();
    if (text.includes("\u0000")) {
      setNotice(`${file.name} does not look like a text netlist; it was not opened.`);
      return;
    }
    replaceNetlist(text);
    setNotice(`Opened ${file.name}. Undo (Ctrl+Z) brings back the previous text.`);
  }

  return (
    <div className="grid gap-5 lg:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
      <section aria-labelledby="netlist-heading" className="flex min-w-0 flex-col gap-3">
        <div className="flex flex-wrap items-center justify-between gap-2">
          <h2 id="netlist-heading" className="text-ink-900 text-lead font-semibold">
            Netlist
          </h2>
          <div className="flex flex-wrap items-center gap-2">
            <ExamplePicker
              examples={examples}
              onPick={(ex) => {
                replaceNetlist(ex.text);
                setNotice(`Loaded the example “${ex.title}”. Undo (Ctrl+Z) brings back your text.`);
              }}
            />
            <PlainButton
              type="button"
              onClick={() => fileRef.current?.click()}
              className="border-paper-300 text-ink-800 hover:bg-paper-100 h-8 rounded-md border bg-white px-3 text-sm font-medium"
            >
              Open .pwn file
            </PlainButton>
            <input
              ref={fileRef}
              type="file"
              accept=".pwn,text/plain"
              className="sr-only"
              aria-label="Open a netlist file"
              data-testid="netlist-file"
              onChange={(e) => {
                const file = e.target.files?.[0];
                if (file) void loadFile(file);
                e.target.value = "";
              }}
            />
          </div>
        </div>
        <section
          data-testid="editor-drop"
          aria-label="Netlist editor (drop a .pwn file here to open it)"
          className={`rounded-panel shadow-panel relative h-[55vh] min-h-72 overflow-hidden border bg-white lg:h-[calc(100dvh-19rem)] ${
            dragging ? "border-copper-400 ring-copper-200 ring-2" : "border-paper-200"
          }`}
          onDragOverCapture={(e) => {
            if (!e.dataTransfer.types.includes("Files")) return;
            e.preventDefault();
            e.stopPropagation();
            setDragging(true);
          }}
          onDragLeave={() => setDragging(false)}
          onDropCapture={(e) => {
            if (!e.dataTransfer.types.includes("Files")) return;
            e.preventDefault();
            e.stopPropagation();
            setDragging(false);
            const file = e.dataTransfer.files[0];
            if (file) void loadFile(file);
          }}
        >
          <CodeEditor
            ref={editorRef}
            value={netlist}
            onChange={onChange}
            errors={errors}
            warnings={warnings}
            ariaLabel={`Netlist for ${projectName}`}
          />
          {dragging ? (
            <div className="bg-copper-50/80 text-copper-700 pointer-events-none absolute inset-0 flex items-center justify-center font-medium">
              Drop a .pwn file to open it
            </div>
          ) : null}
        </section>
        <p className="text-caption text-ink-500 -mt-1">
          Tab indents in the editor; <kbd className="text-ink-700">Ctrl+M</kbd> (Mac:{" "}
          <kbd className="text-ink-700">Ctrl+Shift+M</kbd>) then Tab moves on to the title.
        </p>
        <p role="status" aria-live="polite" className="text-ink-600 text-sm empty:hidden">
          {notice}
        </p>
        <SaveRunForm
          projectId={projectId}
          netlist={netlist}
          onNetlistErrors={setSaveErrors}
          disabled={netlist.trim() === ""}
          supersedes={revise ? { id: revise.id, title: revise.title } : undefined}
          fallbackTitle={lastGood?.title ?? "Full analysis"}
        />
        <details className="rounded-panel border-paper-200 group border bg-white">
          <summary className="text-ink-800 hover:bg-paper-50 rounded-panel cursor-pointer px-4 py-3 text-sm font-medium">
            Standard parts for a target frequency (E-series R and C pairs)
          </summary>
          <div className="border-paper-200 border-t p-4">
            <SnapHelper
              names={freePairNames(netlist)}
              onInsert={(text) => {
                editorRef.current?.insertLines(text);
                setNotice("Inserted the pair above the cursor. Undo (Ctrl+Z) takes it out again.");
              }}
            />
          </div>
        </details>
      </section>

      <section aria-labelledby="preview-heading" className="flex min-w-0 flex-col gap-3">
        <div className="flex items-center justify-between gap-2">
          <h2 id="preview-heading" className="text-ink-900 text-lead font-semibold">
            Preview
          </h2>
          {focusHz !== null ? (
            <PlainButton
              type="button"
              onClick={() => setFocusHz(null)}
              className="border-paper-300 text-ink-700 hover:bg-paper-100 h-8 rounded-md border bg-white px-3 text-sm"
            >
              Show the whole sweep
            </PlainButton>
          ) : null}
        </div>
        <PreviewPanel
          view={view}
          onRunFull={() =>
            (document.getElementById(SAVE_RUN_FORM_ID) as HTMLFormElement | null)?.requestSubmit()
          }
          onGoToLine={(line, column) => editorRef.current?.revealLine(line, column)}
          onSelectFrequency={(hz) => {
            setFocusHz(hz);
            document
              .getElementById("preview-heading")
              ?.scrollIntoView({ block: "nearest", behavior: "smooth" });
          }}
          plot={plot}
        />
      </section>
    </div>
  );
}
