"use client";

import { loader } from "@monaco-editor/react";
import type * as Monaco from "monaco-editor";

/**
 * Loads the editor the app serves itself (scripts/build-monaco.mjs → public/monaco/): the editor core
 * without bundled languages, and only its own worker. Once, on first use; the editor page's other
 * JavaScript does not wait for it.
 */
let loading: Promise<typeof Monaco> | null = null;

export function loadMonaco(): Promise<typeof Monaco> {
  loading ??= new Promise<typeof Monaco>((resolve, reject) => {
    const w = window as unknown as {
      MonacoEnvironment?: { getWorkerUrl: () => string };
      pwMonaco?: typeof Monaco;
    };
    if (w.pwMonaco) return resolve(w.pwMonaco);
    w.MonacoEnvironment = { getWorkerUrl: () => "/monaco/editor.worker.js" };
    const css = document.createElement("link");
    css.rel = "stylesheet";
    css.href = "/monaco/pw-editor.css";
    document.head.append(css);
    const script = document.createElement("script");
    script.src = "/monaco/pw-editor.js";
    script.async = true;
    script.onload = () =>
      w.pwMonaco ? resolve(w.pwMonaco) : reject(new Error("the editor script ran but gave no editor"));
    script.onerror = () => reject(new Error("the editor script could not be loaded"));
    document.head.append(script);
  })
    .then((monaco) => {
      loader.config({ monaco });
      return monaco;
    })
    .catch((err: unknown) => {
      loading = null; // let a later attempt try again
      throw err;
    });
  return loading;
}
