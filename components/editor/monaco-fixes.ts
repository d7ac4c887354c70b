/**
 * Our own wording for the solver's markers in Monaco: the error and its hint in a hover of ours, and
 * every `NetlistError.fix` as a quick fix (lightbulb, Ctrl+. / ⌘.). Monaco's stock marker hover and
 * its status bar ("View Problem", "No quick fixes available") are hidden by app/globals.css
 * (`.pw-editor`), so the hover below is the only one that speaks about problems.
 */
import type * as Monaco from "monaco-editor";
import type { NetlistError, NetlistFix, Warning } from "@/solver/types";

export const MARKER_OWNER = "phasewright";

interface Problem {
  marker: Monaco.editor.IMarkerData;
  error: boolean;
  fix?: NetlistFix;
}

/**
 * The problems of a model and the text version they were computed for. Markers are not moved when
 * the text changes, so after an edit (and until the next check) neither the hover nor a quick fix
 * may act on them: a fix applied at a stale column would corrupt the line.
 */
const problems = new WeakMap<Monaco.editor.ITextModel, { version: number; list: Problem[] }>();

/** The problems that still describe the model's current text (none while a check is pending). */
function currentProblems(model: Monaco.editor.ITextModel): Problem[] {
  const entry = problems.get(model);
  return entry && entry.version === model.getVersionId() ? entry.list : [];
}

const isMac = () => typeof navigator !== "undefined" && /Mac|iPhone|iPad/.test(navigator.platform);

/** The marker text (also what screen readers hear): message, then the hint. */
function markerMessage(e: NetlistError): string {
  return e.hint ? `${e.message} — ${e.hint}` : e.message;
}

/** Shows the solver's errors (with hints and fixes) and warnings as markers in the editor. */
export function setNetlistMarkers(
  monaco: typeof Monaco,
  model: Monaco.editor.ITextModel,
  errors: NetlistError[],
  warnings: Warning[],
): void {
  const lines = model.getLineCount();
  const list: Problem[] = [];
  for (const e of errors) {
    const line = Math.min(Math.max(e.line, 1), lines);
    const marker: Monaco.editor.IMarkerData = {
      severity: monaco.MarkerSeverity.Error,
      startLineNumber: line,
      startColumn: e.column,
      endLineNumber: line,
      endColumn: Math.max(e.endColumn, e.column + 1),
      message: markerMessage(e),
    };
    list.push(e.fix && e.fix.line <= lines ? { marker, error: true, fix: e.fix } : { marker, error: true });
  }
  for (const w of warnings) {
    if (w.line === null || w.line > lines) continue;
    list.push({
      error: false,
      marker: {
        severity: monaco.MarkerSeverity.Warning,
        startLineNumber: w.line,
        startColumn: 1,
        endLineNumber: w.line,
        endColumn: model.getLineMaxColumn(w.line),
        message: w.message,
      },
    });
  }
  problems.set(model, { version: model.getVersionId(), list });
  monaco.editor.setModelMarkers(
    model,
    MARKER_OWNER,
    list.map((p) => p.marker),
  );
}

const touches = (m: Monaco.editor.IMarkerData, line: number, column: number) =>
  m.startLineNumber <= line && line <= m.endLineNumber && m.startColumn <= column && column <= m.endColumn;

/** Markdown-escape the text outside `code` spans (inside them a backslash would show). */
function escapeOutsideCode(text: string): string {
  return text
    .split("`")
    .map((piece, i) => (i % 2 === 1 ? piece : piece.replace(/[\\*_[\]<>]/g, (c) => `\\${c}`)))
    .join("`");
}

/** Markdown for the problems under the cursor, in our words. */
export function problemHover(model: Monaco.editor.ITextModel, line: number, column: number): string | null {
  const here = currentProblems(model).filter((p) => touches(p.marker, line, column));
  if (here.length === 0) return null;
  const keys = isMac() ? "⌘." : "Ctrl+.";
  return here
    .map(({ marker, error, fix }) => {
      const body = `**${error ? "Netlist error" : "Note"}** · ${escapeOutsideCode(marker.message)}`;
      return fix ? `${body}\n\nOne-step fix: ${fix.label} — press ${keys} or the lightbulb.` : body;
    })
    .join("\n\n---\n\n");
}

/** Quick fixes for the problems in `range` (the lightbulb and Ctrl+. list them). */
function codeActions(
  monaco: typeof Monaco,
  model: Monaco.editor.ITextModel,
  range: Monaco.Range,
): Monaco.languages.CodeAction[] {
  const actions: Monaco.languages.CodeAction[] = [];
  for (const { marker, fix } of currentProblems(model)) {
    if (!fix) continue;
    const markerRange = new monaco.Range(
      marker.startLineNumber,
      marker.startColumn,
      marker.endLineNumber,
      marker.endColumn,
    );
    if (!monaco.Range.areIntersectingOrTouching(markerRange, range)) continue;
    actions.push({
      title: fix.label,
      kind: "quickfix",
      isPreferred: true,
      diagnostics: [{ ...marker, owner: MARKER_OWNER, resource: model.uri } as Monaco.editor.IMarkerData],
      edit: {
        edits: [
          {
            resource: model.uri,
            versionId: model.getVersionId(),
            textEdit: {
              range: new monaco.Range(fix.line, fix.column, fix.line, fix.endColumn),
              text: fix.text,
            },
          },
        ],
      },
    });
  }
  return actions;
}

/** Registers the quick-fix provider once (with the language, monaco-setup.ts). */
export function registerNetlistFixes(monaco: typeof Monaco, languageId: string): void {
  monaco.languages.registerCodeActionProvider(
    languageId,
    {
      provideCodeActions(model, range) {
        return { actions: codeActions(monaco, model, range), dispose() {} };
      },
    },
    { providedCodeActionKinds: ["quickfix"] },
  );
}
