"use client";

import Editor, { type Monaco } from "@monaco-editor/react";
import type * as MonacoNs from "monaco-editor";
import { forwardRef, useEffect, useImperativeHandle, useRef, useState } from "react";
import { LANGUAGE_ID } from "@/lib/netlist-language";
import type { NetlistError, Warning } from "@/solver/types";
import { loadMonaco } from "./load-monaco";
import { registerNetlistLanguage, setNetlistMarkers, THEME_ID } from "./monaco-setup";

export interface CodeEditorHandle {
  /** Replaces the whole text as one undoable edit (upload, example, restored draft). */
  replaceText(text: string): void;
  /** Moves the cursor to a line (and column) and focuses the editor. */
  revealLine(line: number, column?: number): void;
  /** Inserts whole lines above the cursor's line as one undoable edit. */
  insertLines(text: string): void;
  focus(): void;
}

export interface CodeEditorProps {
  /** The text. Monaco owns it while the user types; a different value replaces it as one undoable edit. */
  value: string;
  onChange: (value: string) => void;
  errors: NetlistError[];
  warnings: Warning[];
  /** Accessible name of the editing area. */
  ariaLabel?: string;
}

/** Monaco with the netlist language: highlighting, completion, hover help and the solver's markers. */
export const CodeEditor = forwardRef<CodeEditorHandle, CodeEditorProps>(function CodeEditor(
  { value, onChange, errors, warnings, ariaLabel = "Netlist" },
  ref,
) {
  const monacoRef = useRef<Monaco | null>(null);
  const editorRef = useRef<MonacoNs.editor.IStandaloneCodeEditor | null>(null);
  const [mounted, setMounted] = useState(false);
  // The editor's own script (public/monaco, no CDN) loads once; until then a placeholder, on failure why.
  const [engine, setEngine] = useState<"loading" | "ready" | string>("loading");
  useEffect(() => {
    let live = true;
    loadMonaco().then(
      () => live && setEngine("ready"),
      (err: unknown) =>
        live &&
        setEngine(
          `The editor could not load (${err instanceof Error ? err.message : "unknown"}). Reload the page to try again; your draft is kept.`,
        ),
    );
    return () => {
      live = false;
    };
  }, []);
  const valueRef = useRef(value);
  valueRef.current = value;

  // Only outside changes are pushed into Monaco. Echoing every keystroke back as a controlled value
  // would race the user's typing and drop characters.
  const replaceText = (text: string) => {
    const editor = editorRef.current;
    const model = editor?.getModel();
    if (!editor || !model || model.getValue() === text) return;
    editor.pushUndoStop();
    editor.executeEdits("replace", [{ range: model.getFullModelRange(), text }]);
    editor.pushUndoStop();
  };

  useImperativeHandle(ref, () => ({
    replaceText,
    revealLine(line, column = 1) {
      const editor = editorRef.current;
      if (!editor) return;
      editor.revealLineInCenter(line);
      editor.setPosition({ lineNumber: line, column });
      editor.focus();
    },
    insertLines(text) {
      const editor = editorRef.current;
      const line = editor?.getPosition()?.lineNumber ?? 1;
      if (!editor) return;
      const body = text.endsWith("\n") ? text : `${text}\n`;
      editor.pushUndoStop();
      editor.executeEdits("insert", [
        { range: { startLineNumber: line, startColumn: 1, endLineNumber: line, endColumn: 1 }, text: body },
      ]);
      editor.pushUndoStop();
      editor.focus();
    },
    focus() {
      editorRef.current?.focus();
    },
  }));

  useEffect(() => {
    const monaco = monacoRef.current;
    const model = editorRef.current?.getModel();
    if (mounted && monaco && model) setNetlistMarkers(monaco, model, errors, warnings);
  }, [errors, warnings, mounted]);

  if (engine === "loading") {
    // The netlist itself (server-rendered, same font and lines as the editor) while the editor's script loads.
    return (
      <div className="relative h-full overflow-auto" data-testid="editor-placeholder">
        <span role="status" className="sr-only">
          Loading editor…
        </span>
        {/* Columns where the editor puts them: line numbers 39 px wide, the text 26 px further. */}
        <div className="flex py-2 font-mono text-[13px] leading-5">
          <pre aria-hidden="true" className="text-ink-500 m-0 w-[39px] shrink-0 text-right select-none">
            {value
              .split("\n")
              .map((_, i) => i + 1)
              .join("\n")}
          </pre>
          <pre className="text-ink-900 m-0 pl-[26px] whitespace-pre">{value}</pre>
        </div>
      </div>
    );
  }
  if (engine !== "ready") {
    return (
      <div role="alert" className="text-ink-500 p-4 text-sm">
        {engine}
      </div>
    );
  }
  return (
    <Editor
      defaultValue={value}
      language={LANGUAGE_ID}
      theme={THEME_ID}
      beforeMount={(monaco) => registerNetlistLanguage(monaco)}
      onMount={(editor, monaco) => {
        editorRef.current = editor;
        monacoRef.current = monaco;
        // The text may have changed (a restored draft) while the editor was loading.
        if (editor.getValue() !== valueRef.current) editor.setValue(valueRef.current);
        setMounted(true);
      }}
      onChange={(v) => onChange(v ?? "")}
      loading={<div className="text-ink-500 p-4 text-sm">Loading editor…</div>}
      options={{
        ariaLabel,
        fontFamily: '"JetBrains Mono", ui-monospace, monospace',
        fontSize: 13,
        lineHeight: 20,
        minimap: { enabled: false },
        scrollBeyondLastLine: false,
        wordWrap: "off",
        tabSize: 2,
        renderLineHighlight: "line",
        automaticLayout: true,
        fixedOverflowWidgets: true,
        quickSuggestions: { other: true, comments: false, strings: false },
        wordBasedSuggestions: "off",
        // Enter ends a line unless a suggestion would change the text; Tab always accepts.
        acceptSuggestionOnEnter: "smart",
        padding: { top: 8, bottom: 8 },
      }}
    />
  );
});
