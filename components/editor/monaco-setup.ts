import type * as Monaco from "monaco-editor";
import { plotColors } from "@/components/plot/palette";
import {
  collectNames,
  completionContext,
  E_SERIES,
  EXPRESSION_FNS,
  functionDoc,
  hoverDoc,
  kindDoc,
  LANGUAGE_ID,
  LEVEL_WORDS,
  LOOP_METHODS,
  loopMethodDoc,
  MEASURE_FNS,
  OPTIONS,
  PART_KINDS,
  PROBE_FNS,
  STATEMENTS,
  SUB_KEYWORDS,
  statementDoc,
} from "@/lib/netlist-language";
import config from "@/tailwind.config";
import { problemHover, registerNetlistFixes } from "./monaco-fixes";

export { setNetlistMarkers } from "./monaco-fixes";

export const THEME_ID = "phasewright-paper";
const hex = (c: string) => c.replace("#", "");
const colors = config.theme.extend.colors;

/** Monarch grammar: statements, kinds, functions, options, numbers with prefixes and units, comments. */
const monarch: Monaco.languages.IMonarchLanguage & Record<string, unknown> = {
  defaultToken: "",
  statements: STATEMENTS.filter((s) => !s.includes("-")),
  kinds: PART_KINDS,
  functions: [...MEASURE_FNS.filter((f) => !f.includes("-")), ...PROBE_FNS, ...EXPRESSION_FNS],
  subKeywords: SUB_KEYWORDS,
  series: E_SERIES,
  tokenizer: {
    root: [
      [/#.*$/, "comment"],
      [/^(\s*)(title)(\b(?:[^#\\]|\\.)*)/, ["white", "keyword", "string"]],
      [/^(\s*)([A-Za-z_][\w.]*)(\s*)(:)/, ["white", "type.identifier", "white", "delimiter"]],
      [/(zero-phase|phase-margin|gain-margin)(?![\w-])/, "predefined"],
      [/monte-carlo(?![\w-])/, "keyword"],
      [/half-power(?![\w-])/, "constant"],
      [/([A-Za-z_]\w*)(=)/, ["attribute.name", "operator"]],
      [/\d+[RkMGTmunpf]\d+(?:Ω|ohm|Hz|F|H)?(?![\w.])/, "number"],
      [
        /(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?(?:[fpnuµmkMGT])?(?:Ω|ohm|Hz|dB|deg|°|%|[FHVAS])?(?![\w.])/,
        "number",
      ],
      [/\d[\w.]*/, "number.invalid"],
      [
        /[A-Za-z_µ][\w.]*/,
        {
          cases: {
            "@statements": "keyword",
            "@kinds": "type",
            "@functions": "predefined",
            "@subKeywords": "keyword.flow",
            "@series": "constant",
            "gnd|pi": "constant",
            "@default": "identifier",
          },
        },
      ],
      [/[<>]=?|[=+\-*/]/, "operator"],
      [/[(),]/, "delimiter"],
      [/\\\s*$/, "delimiter"],
    ],
  },
};

let registered = false;

/** Registers the language, its theme, completion and hover once per page load. */
export function registerNetlistLanguage(monaco: typeof Monaco): void {
  if (registered) return;
  registered = true;
  monaco.languages.register({ id: LANGUAGE_ID, extensions: [".pwn"], aliases: ["Phasewright netlist"] });
  monaco.languages.setMonarchTokensProvider(LANGUAGE_ID, monarch);
  monaco.languages.setLanguageConfiguration(LANGUAGE_ID, {
    comments: { lineComment: "#" },
    brackets: [["(", ")"]],
    autoClosingPairs: [{ open: "(", close: ")" }],
    wordPattern: /[A-Za-z_µ][\w.-]*|-?\d[\w.µΩ°%]*/g,
  });
  monaco.editor.defineTheme(THEME_ID, {
    base: "vs",
    inherit: true,
    rules: [
      { token: "comment", foreground: hex(colors.ink[400]), fontStyle: "italic" },
      { token: "keyword", foreground: hex(colors.board[700]), fontStyle: "bold" },
      { token: "keyword.flow", foreground: hex(colors.board[500]) },
      { token: "type", foreground: hex(colors.copper[600]), fontStyle: "bold" },
      { token: "type.identifier", foreground: hex(colors.ink[900]), fontStyle: "bold" },
      { token: "predefined", foreground: hex(colors.board[600]) },
      { token: "number", foreground: hex(colors.copper[700]) },
      { token: "number.invalid", foreground: hex(colors.signal.fault), fontStyle: "underline" },
      { token: "attribute.name", foreground: hex(colors.ink[500]) },
      { token: "constant", foreground: hex(colors.board[800]) },
      { token: "string", foreground: hex(colors.ink[700]) },
      { token: "identifier", foreground: hex(colors.ink[800]) },
      { token: "operator", foreground: hex(colors.ink[500]) },
    ],
    colors: {
      "editor.background": "#ffffff",
      "editorLineNumber.foreground": colors.ink[300],
      "editorLineNumber.activeForeground": colors.ink[700],
      "editor.lineHighlightBackground": colors.paper[50],
      "editor.selectionBackground": colors.copper[100],
      "editorCursor.foreground": plotColors.marker,
    },
  });

  monaco.languages.registerCompletionItemProvider(LANGUAGE_ID, {
    triggerCharacters: [" ", "(", ","],
    provideCompletionItems(model, position) {
      const word = model.getWordUntilPosition(position);
      const range = new monaco.Range(
        position.lineNumber,
        word.startColumn,
        position.lineNumber,
        word.endColumn,
      );
      const before = model.getValueInRange(
        new monaco.Range(position.lineNumber, 1, position.lineNumber, position.column),
      );
      const names = collectNames(model.getValue());
      const K = monaco.languages.CompletionItemKind;
      const item = (
        label: string,
        kind: Monaco.languages.CompletionItemKind,
        detail: string,
        doc = "",
        insert = label,
      ) => ({
        label,
        kind,
        detail,
        documentation: doc ? { value: doc } : undefined,
        insertText: insert,
        range,
      });
      const kinds = () => [
        ...PART_KINDS.map((k) => item(k, K.Class, "part kind", kindDoc(k))),
        ...names.presets.map((p) => item(p, K.Class, "preset")),
        ...names.blocks.map((b) => item(b, K.Module, "block")),
      ];
      const fns = () =>
        MEASURE_FNS.map((f) => item(f, K.Function, "measure function", functionDoc(f), `${f}(`));
      const statements = () => STATEMENTS.map((s) => item(s, K.Keyword, "statement", statementDoc(s)));
      const nodes = () => names.nodes.map((n) => item(n, K.Variable, "node"));
      const parts = () => names.parts.map((p) => item(p, K.Field, "part"));
      const traces = () => names.traces.map((t) => item(t, K.Value, "trace"));
      const measures = () => names.measures.map((m) => item(m, K.Constant, "measure"));
      const lets = () => names.lets.map((l) => item(l, K.Variable, "let"));
      const options = () => Object.entries(OPTIONS).map(([o, d]) => item(`${o}=`, K.Property, "option", d));
      let suggestions: ReturnType<typeof item>[];
      switch (completionContext(before)) {
        case "statement":
          suggestions = [...statements(), ...parts()];
          break;
        case "kind":
          suggestions = kinds();
          break;
        case "node":
          suggestions = nodes();
          break;
        case "part":
          suggestions = parts();
          break;
        case "trace":
          suggestions = [
            ...traces(),
            ...LEVEL_WORDS.map((l) => item(l, K.Constant, "level", functionDoc(l))),
          ];
          break;
        case "function":
          suggestions = fns();
          break;
        case "measure":
          suggestions = measures();
          break;
        case "option":
          suggestions = [...options(), ...nodes(), ...lets()];
          break;
        case "loop-option":
          suggestions = [item("method=", K.Property, "option", OPTIONS.method)];
          break;
        case "loop-method":
          suggestions = LOOP_METHODS.map((m) => item(m, K.EnumMember, "loop method", loopMethodDoc(m)));
          break;
        default:
          suggestions = [
            ...SUB_KEYWORDS.map((s) => item(s, K.Keyword, "keyword")),
            ...PROBE_FNS.map((f) => item(f, K.Function, "probe", functionDoc(f), `${f}(`)),
            ...EXPRESSION_FNS.map((f) => item(f, K.Function, "expression")),
            ...fns(),
            ...lets(),
            ...nodes(),
            ...parts(),
            ...traces(),
            ...measures(),
          ];
      }
      return { suggestions };
    },
  });

  registerNetlistFixes(monaco, LANGUAGE_ID);
  monaco.languages.registerHoverProvider(LANGUAGE_ID, {
    provideHover(model, position) {
      // Problems first (in our words; Monaco's own marker hover is hidden), then the word's help.
      const problem = problemHover(model, position.lineNumber, position.column);
      const word = model.getWordAtPosition(position);
      const doc = word ? hoverDoc(word.word.replace(/=$/, "")) : null;
      if (!problem && !doc) return null;
      const contents = [problem, doc].filter((v): v is string => v !== null).map((value) => ({ value }));
      return word
        ? {
            range: new monaco.Range(
              position.lineNumber,
              word.startColumn,
              position.lineNumber,
              word.endColumn,
            ),
            contents,
          }
        : { contents };
    },
  });
}
