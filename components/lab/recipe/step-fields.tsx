"use client";

import { MatrixGrid, Vec3Inputs } from "@/components/lab/recipe/matrix-grid";
import { CHANNEL_OPTIONS, Choice, NumberInput } from "@/components/lab/recipe/number-input";
import { RectFields } from "@/components/lab/recipe/rect-fields";
import { fieldError } from "@/components/lab/recipe/defaults";
import { DenoisedStillPicker } from "@/components/lab/recipe/denoised-still-picker";
import type { RecipeStep } from "@/lib/lab/recipe";

type Props<S extends RecipeStep> = { id: string; step: S; onChange(next: RecipeStep): void; errors: Record<string, string> };
type Of<O extends RecipeStep["op"]> = Extract<RecipeStep, { op: O }>;

const check = "h-4 w-4 accent-[var(--color-accent)]";

/** The parameter fields of one step, by op. */
export function StepFields(props: Props<RecipeStep>) {
  const { id, step, onChange, errors } = props;
  const e = (f: string) => fieldError(errors, f);
  switch (step.op) {
    case "matrix":
      return <MatrixFields {...props} step={step} />;
    case "copy":
      return (
        <div className="grid grid-cols-2 gap-2 sm:max-w-80">
          <Choice id={`${id}-from`} label="From channel" value={step.from} options={CHANNEL_OPTIONS} onChange={(from) => onChange({ ...step, from })} error={e("from")} />
          <Choice id={`${id}-to`} label="Into channel" value={step.to} options={CHANNEL_OPTIONS} onChange={(to) => onChange({ ...step, to })} error={e("to")} />
        </div>
      );
    case "level":
      return (
        <div className="space-y-2">
          <div className="grid grid-cols-3 gap-2 sm:max-w-xl">
            <Choice id={`${id}-channel`} label="Adjust channel" value={step.channel} options={CHANNEL_OPTIONS} onChange={(channel) => onChange({ ...step, channel })} error={e("channel")} />
            <Choice id={`${id}-ref`} label="To match the plate's channel" value={step.ref} options={CHANNEL_OPTIONS} onChange={(ref) => onChange({ ...step, ref })} error={e("ref")} />
            <Choice id={`${id}-fit`} label="Fit" value={step.fit} options={[["gain", "Gain only"], ["gain+offset", "Gain and offset"]]} onChange={(fit) => onChange({ ...step, fit })} error={e("fit")} />
          </div>
          <RectFields id={id} rect={step.rect} onChange={(rect) => onChange({ ...step, rect })} errors={errors} />
        </div>
      );
    case "matte":
      return <MatteFields {...props} step={step} />;
    case "grow":
      return (
        <NumberInput id={`${id}-px`} className="sm:max-w-48" label="Grow by (negative shrinks)" unit="px" step={1} min={-256} max={256} value={step.px}
          onChange={(px) => onChange({ ...step, px: Math.round(px) })} error={e("px")} />
      );
    case "soften":
      return (
        <div className="grid grid-cols-2 gap-2 sm:max-w-80">
          <NumberInput id={`${id}-sigma`} label="Sigma" unit="px" min={0.1} max={200} step={0.1} value={step.sigma} onChange={(sigma) => onChange({ ...step, sigma })} error={e("sigma")} />
          <Choice id={`${id}-target`} label="Soften" value={step.target} options={[["matte", "The matte"], ...CHANNEL_OPTIONS]} onChange={(target) => onChange({ ...step, target })} error={e("target")} />
        </div>
      );
    case "mix":
      return (
        <label className="flex items-center gap-2 text-sm">
          <input type="checkbox" className={check} checked={step.invert} onChange={(ev) => onChange({ ...step, invert: ev.target.checked })} />
          Invert the matte (cleaned outside, original inside)
        </label>
      );
    case "flatten":
      return (
        <div className="space-y-2">
          <div className="grid grid-cols-2 gap-2 sm:max-w-80">
            <NumberInput id={`${id}-sigma`} label="Screen blur sigma" unit="px" min={0.1} max={200} step={1} value={step.sigma} onChange={(sigma) => onChange({ ...step, sigma })} error={e("sigma")} />
            <Choice id={`${id}-weight`} label="Clean screen is" value={step.weight} options={[["outside", "Outside the matte"], ["inside", "Inside the matte"], ["all", "Everywhere"]]} onChange={(weight) => onChange({ ...step, weight })} error={e("weight")} />
          </div>
          <Vec3Inputs id={id} legend="Target screen colour (0..1)" field="color" v={step.color} onChange={(color) => onChange({ ...step, color })} errors={errors} />
        </div>
      );
    case "grain":
      return <DenoisedStillPicker id={id} value={step.denoised} onChange={(denoised) => onChange({ ...step, denoised })} error={e("denoised")} />;
  }
}

function MatrixFields({ id, step, onChange, errors }: Props<Of<"matrix">>) {
  return (
    <div className="space-y-2">
      <MatrixGrid id={id} m={step.m} onChange={(m) => onChange({ ...step, m })} errors={errors} />
      <label className="flex items-center gap-2 text-sm">
        <input type="checkbox" className={check} checked={step.offset !== undefined}
          onChange={(ev) => onChange({ ...step, offset: ev.target.checked ? [0, 0, 0] : undefined })} />
        Add an offset per channel
      </label>
      {step.offset ? <Vec3Inputs id={id} legend="Offset" field="offset" v={step.offset} onChange={(offset) => onChange({ ...step, offset })} errors={errors} /> : null}
    </div>
  );
}

function MatteFields({ id, step, onChange, errors }: Props<Of<"matte">>) {
  const e = (f: string) => fieldError(errors, f);
  const weights = Array.isArray(step.channel);
  return (
    <div className="space-y-2">
      <div className="grid grid-cols-2 gap-2 sm:grid-cols-4">
        <Choice id={`${id}-channel`} label="From" value={weights ? "w" : (step.channel as string)}
          options={[...CHANNEL_OPTIONS, ["w", "Weighted R, G, B"]]}
          onChange={(v) => onChange({ ...step, channel: v === "w" ? [0, 1, 0] : (v as "r" | "g" | "b") })} error={weights ? undefined : e("channel")} />
        <Choice id={`${id}-source`} label="Of" value={step.source} options={[["current", "The working image"], ["plate", "The plate (denoised, with grain restored)"]]} onChange={(source) => onChange({ ...step, source })} error={e("source")} />
        <NumberInput id={`${id}-black`} label="Black point" min={-100} max={100} value={step.black} onChange={(black) => onChange({ ...step, black })} error={e("black")} />
        <NumberInput id={`${id}-white`} label="White point" min={-100} max={100} value={step.white} onChange={(white) => onChange({ ...step, white })} error={e("white")} />
      </div>
      {Array.isArray(step.channel) ? (
        <Vec3Inputs id={id} legend="Weights" field="channel" v={step.channel} onChange={(channel) => onChange({ ...step, channel })} errors={errors} />
      ) : null}
    </div>
  );
}
