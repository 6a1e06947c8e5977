"use client";

import { useMutation } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useId, useState } from "react";
import { Button } from "@/components/ui/button";
import { describedBy, Field, Select, TextInput } from "@/components/ui/field";
import { ApiError, apiFetch } from "@/lib/api/fetcher";
import { compileShotPattern, createShowSchema, DEFAULT_SHOT_PATTERN, SHOW_KIND_LABELS, SHOW_KINDS, SHOW_STATE_LABELS, SHOW_STATES, updateShowSchema, type ShowKind, type ShowResponse, type ShowState, type UpdateShowInput } from "@/lib/shows/schemas";

type Errors = Record<string, string>;

/** Field messages from zod (checked here first) or from the server's error shape. */
function fieldErrors(issues: { path: PropertyKey[]; message: string }[]): Errors {
  const out: Errors = {};
  for (const i of issues) {
    const key = String(i.path[0] ?? "form");
    out[key] ??= i.message;
  }
  return out;
}
const serverErrors = (e: unknown): Errors => (e instanceof ApiError ? { ...(e.fields ?? {}), ...(e.fields ? {} : { form: e.message }) } : { form: "Saving failed; nothing was changed." });

const PATTERN_HINT = "A regular expression; {CODE} stands for the show's code. A group named seq, as in (?<seq>\\d{3}), gives the sequence.";

/** Does `code` fit the pattern? null when the pattern does not compile. */
/** The shot-code pattern input, shared by the new-show and edit-show forms. */
function PatternField({ id, value, onChange, error }: { id: string; value: string; onChange(next: string): void; error?: string }) {
  return (
    <Field id={id} label="Shot-code pattern" error={error} hint={PATTERN_HINT}>
      <TextInput
        id={id}
        className="font-mono"
        value={value}
        onChange={(e) => onChange(e.target.value)}
        spellCheck={false}
        aria-invalid={Boolean(error)}
        aria-describedby={describedBy(id, error, PATTERN_HINT)}
      />
    </Field>
  );
}

export function patternAccepts(pattern: string, showCode: string, code: string): boolean | null {
  try {
    return compileShotPattern(pattern.trim(), showCode).test(code.trim());
  } catch {
    return null;
  }
}

/** Leads: create a show, then go to it. */
export function NewShowForm() {
  const router = useRouter();
  const uid = useId();
  const [code, setCode] = useState("");
  const [name, setName] = useState("");
  const [kind, setKind] = useState<ShowKind>("feature");
  const [pattern, setPattern] = useState(DEFAULT_SHOT_PATTERN);
  const [errors, setErrors] = useState<Errors>({});
  const create = useMutation({
    mutationFn: (json: unknown) => apiFetch<ShowResponse>("/api/shows", { method: "POST", json }),
    onSuccess: (show) => router.push(`/shows/${show.code}`),
    onError: (e) => setErrors(serverErrors(e)),
  });

  function submit(e: React.FormEvent) {
    e.preventDefault();
    const parsed = createShowSchema.safeParse({ code, name, kind, shotPattern: pattern });
    if (!parsed.success) return setErrors(fieldErrors(parsed.error.issues));
    setErrors({});
    create.mutate(parsed.data);
  }

  const id = (f: string) => `${uid}-${f}`;
  return (
    <form onSubmit={submit} className="grid gap-3 sm:grid-cols-[8rem_minmax(0,1fr)_10rem]" aria-label="New show" noValidate>
      <Field id={id("code")} label="Code" error={errors.code} hint="2–8 letters or digits">
        <TextInput
          id={id("code")}
          className="font-mono uppercase"
          value={code}
          onChange={(e) => setCode(e.target.value.toUpperCase())}
          placeholder="SLM"
          aria-invalid={Boolean(errors.code)}
          aria-describedby={describedBy(id("code"), errors.code, "2–8 letters or digits")}
        />
      </Field>
      <Field id={id("name")} label="Name" error={errors.name}>
        <TextInput id={id("name")} value={name} onChange={(e) => setName(e.target.value)} placeholder="Saltmarsh" aria-invalid={Boolean(errors.name)} aria-describedby={describedBy(id("name"), errors.name)} />
      </Field>
      <Field id={id("kind")} label="Kind" error={errors.kind}>
        <Select id={id("kind")} value={kind} onChange={(e) => setKind(e.target.value as ShowKind)}>
          {SHOW_KINDS.map((k) => (
            <option key={k} value={k}>
              {SHOW_KIND_LABELS[k]}
            </option>
          ))}
        </Select>
      </Field>
      <div className="sm:col-span-3">
        <PatternField id={id("pattern")} value={pattern} onChange={setPattern} error={errors.shotPattern} />
      </div>
      {errors.form ? (
        <p role="alert" className="text-sm text-bad sm:col-span-3">
          {errors.form}
        </p>
      ) : null}
      <div className="sm:col-span-3">
        <Button type="submit" variant="primary" disabled={create.isPending}>
          {create.isPending ? "Creating…" : "Create show"}
        </Button>
      </div>
    </form>
  );
}

/** Leads: change a show's name, kind, state and shot-code pattern (the code is fixed). */
export function ShowEditForm({ show }: { show: ShowResponse }) {
  const router = useRouter();
  const uid = useId();
  const [name, setName] = useState(show.name);
  const [kind, setKind] = useState<ShowKind>(show.kind);
  const [state, setState] = useState<ShowState>(show.state);
  const [pattern, setPattern] = useState(show.shotPattern);
  const [tryCode, setTryCode] = useState("");
  const [errors, setErrors] = useState<Errors>({});
  const [saved, setSaved] = useState(false);

  const changes: UpdateShowInput = {
    ...(name.trim() !== show.name ? { name } : {}),
    ...(kind !== show.kind ? { kind } : {}),
    ...(state !== show.state ? { state } : {}),
    ...(pattern.trim() !== show.shotPattern ? { shotPattern: pattern } : {}),
  };
  const dirty = Object.keys(changes).length > 0;
  const save = useMutation({
    mutationFn: (json: UpdateShowInput) => apiFetch<ShowResponse>(`/api/shows/${encodeURIComponent(show.code)}`, { method: "PATCH", json }),
    onSuccess: () => {
      setSaved(true);
      router.refresh();
    },
    onError: (e) => setErrors(serverErrors(e)),
  });

  function submit(e: React.FormEvent) {
    e.preventDefault();
    const parsed = updateShowSchema.safeParse(changes);
    if (!parsed.success) return setErrors(fieldErrors(parsed.error.issues));
    setErrors({});
    setSaved(false);
    save.mutate(parsed.data);
  }

  const accepts = tryCode.trim() ? patternAccepts(pattern, show.code, tryCode) : undefined;
  const id = (f: string) => `${uid}-${f}`;
  return (
    <form onSubmit={submit} className="grid gap-3 sm:grid-cols-3" aria-label={`Edit ${show.code}`} noValidate>
      <div className="sm:col-span-3">
        <Field id={id("name")} label="Name" error={errors.name}>
          <TextInput id={id("name")} value={name} onChange={(e) => setName(e.target.value)} aria-invalid={Boolean(errors.name)} aria-describedby={describedBy(id("name"), errors.name)} />
        </Field>
      </div>
      <Field id={id("kind")} label="Kind" error={errors.kind}>
        <Select id={id("kind")} value={kind} onChange={(e) => setKind(e.target.value as ShowKind)}>
          {SHOW_KINDS.map((k) => (
            <option key={k} value={k}>
              {SHOW_KIND_LABELS[k]}
            </option>
          ))}
        </Select>
      </Field>
      <Field id={id("state")} label="State" error={errors.state}>
        <Select id={id("state")} value={state} onChange={(e) => setState(e.target.value as ShowState)}>
          {SHOW_STATES.map((s) => (
            <option key={s} value={s}>
              {SHOW_STATE_LABELS[s]}
            </option>
          ))}
        </Select>
      </Field>
      <div />
      <div className="sm:col-span-2">
        <PatternField id={id("pattern")} value={pattern} onChange={setPattern} error={errors.shotPattern} />
      </div>
      <div className="space-y-1">
        <Field id={id("try")} label="Try a code">
          <TextInput id={id("try")} className="font-mono" value={tryCode} onChange={(e) => setTryCode(e.target.value.toUpperCase())} placeholder={`${show.code}_010_0010`} />
        </Field>
        <p aria-live="polite" className="text-xs">
          {accepts === undefined ? null : accepts === null ? (
            <span className="text-bad">The pattern does not compile.</span>
          ) : accepts ? (
            <span className="text-ok">Fits the pattern.</span>
          ) : (
            <span className="text-warn">Does not fit the pattern.</span>
          )}
        </p>
      </div>
      <p className="text-xs text-muted sm:col-span-3">A new pattern applies to later imports; shots already stored are kept as they are.</p>
      {errors.form ? (
        <p role="alert" className="text-sm text-bad sm:col-span-3">
          {errors.form}
        </p>
      ) : null}
      <div className="flex items-center gap-3 sm:col-span-3">
        <Button type="submit" variant="primary" disabled={!dirty || save.isPending}>
          {save.isPending ? "Saving…" : "Save show"}
        </Button>
        {saved && !dirty ? (
          <span role="status" className="text-sm text-ok">
            Saved.
          </span>
        ) : null}
      </div>
    </form>
  );
}
