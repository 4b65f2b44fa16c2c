// One CodeMirror wrapper for the template editor (editable, our language, lint) and the Render
// view (read-only C or plain text). Diagnostics are pushed in from outside with setDiagnostics,
// so the page that compiles the template owns them.
import { cpp } from "@codemirror/lang-cpp";
import { lintGutter, linter, setDiagnostics, type Diagnostic } from "@codemirror/lint";
import { EditorView } from "@codemirror/view";
import CodeMirror, { type Extension } from "@uiw/react-codemirror";
import { useEffect, useMemo, useRef } from "react";
import { hbTemplateLanguage } from "~/lib/template/codemirror";
import { codeTheme } from "./codeTheme";

export type CodeLanguage = "template" | "c" | "text";

export function CodeView(props: {
  value: string;
  language: CodeLanguage;
  readOnly?: boolean;
  onChange?: (value: string) => void;
  diagnostics?: Diagnostic[];
  height?: string;
  label: string;
  testId?: string;
  /** Moves the cursor to offset `at` and focuses the editor, each time `seq` changes. */
  jumpTo?: { at: number; seq: number } | null;
}) {
  const { value, language, readOnly = false, onChange, diagnostics, height = "32rem", label, testId, jumpTo } = props;
  const view = useRef<EditorView | null>(null);
  const extensions = useMemo<Extension[]>(() => {
    // The content says it takes focus: a read-only view is not contenteditable and would be out of
    // the keyboard's reach (a scrollable region nobody can scroll without a mouse), and checkers
    // do not count contenteditable as focusable.
    const ext: Extension[] = [EditorView.contentAttributes.of({ "aria-label": label, tabindex: "0" })];
    // linter(null) runs no linter; it makes the diagnostics' state part of the base config, so
    // the wrapper's reconfigure right after creation keeps the diagnostics a page loaded with
    // (otherwise setDiagnostics adds that state on the side and the reconfigure drops it).
    if (language === "template") ext.push(hbTemplateLanguage(), linter(null), lintGutter());
    if (language === "c") ext.push(cpp());
    return ext;
  }, [language, label]);

  useEffect(() => {
    const v = view.current;
    if (v && diagnostics) v.dispatch(setDiagnostics(v.state, diagnostics.filter((d) => d.to <= v.state.doc.length)));
  }, [diagnostics]);

  useEffect(() => {
    const v = view.current;
    if (!v || !jumpTo) return;
    const at = Math.min(Math.max(0, jumpTo.at), v.state.doc.length);
    v.dispatch({ selection: { anchor: at }, scrollIntoView: true });
    v.focus();
  }, [jumpTo?.seq]); // eslint-disable-line react-hooks/exhaustive-deps

  return (
    <div className="overflow-hidden rounded-md border border-soot-600" data-testid={testId}>
      <CodeMirror
        value={value}
        height={height}
        theme={codeTheme}
        editable={!readOnly}
        readOnly={readOnly}
        extensions={extensions}
        onChange={onChange}
        basicSetup={{ foldGutter: false, highlightActiveLine: !readOnly, autocompletion: false }}
        onCreateEditor={(v) => {
          view.current = v;
          if (diagnostics) v.dispatch(setDiagnostics(v.state, diagnostics));
        }}
      />
    </div>
  );
}
