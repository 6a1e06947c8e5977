import type { ExrHeader, ExrPixelType } from "@/lib/exr/header";

/*
 * Layers of an OpenEXR file as a reader chooses among them. Channel names follow the
 * layout's naming convention: "layer.channel", the default layer has no prefix; R, G, B, A
 * (and Y for luminance) are the colour channels. Client-safe: the upload form lists the
 * layers of a dropped file with the same function the server checks the choice with.
 */

export type ExrLayerKind = "rgba" | "rgb" | "grey" | "channel";

export type ExrLayer = {
  /** Stable name used by the API (`layer` field): "<part>/layer:<prefix>" or "<part>/channel:<name>". */
  id: string;
  part: number;
  partName: string | null;
  kind: ExrLayerKind;
  /** Full channel names in output order: R, G, B(, A) for colour layers, one name otherwise. */
  channels: string[];
  pixelTypes: ExrPixelType[];
  label: string;
};

const ROLE: Record<string, "R" | "G" | "B" | "A" | "Y"> = { r: "R", g: "G", b: "B", a: "A", y: "Y" };

function splitName(name: string): { prefix: string; suffix: string } {
  const dot = name.lastIndexOf(".");
  return dot < 0 ? { prefix: "", suffix: name } : { prefix: name.slice(0, dot), suffix: name.slice(dot + 1) };
}

/** Every colour layer (R, G, B with optional A; or Y) and every channel outside them, part by part. */
export function listLayers(header: ExrHeader): ExrLayer[] {
  const out: ExrLayer[] = [];
  for (const part of header.parts) {
    const partLabel = header.multipart ? `part ${part.index}${part.name ? ` “${part.name}”` : ""}${part.view ? ` (view ${part.view})` : ""}: ` : "";
    const typeOf = new Map(part.channels.map((c) => [c.name, c.pixelType]));
    const groups = new Map<string, Map<string, string>>();
    for (const c of part.channels) {
      const { prefix, suffix } = splitName(c.name);
      const role = ROLE[suffix.toLowerCase()];
      if (!role) continue;
      const g = groups.get(prefix) ?? new Map<string, string>();
      if (!g.has(role)) g.set(role, c.name);
      groups.set(prefix, g);
    }
    const used = new Set<string>();
    const prefixes = [...groups.keys()].sort((a, b) => (a === "" ? -1 : b === "" ? 1 : a < b ? -1 : a > b ? 1 : 0));
    for (const prefix of prefixes) {
      const g = groups.get(prefix)!;
      let channels: string[] | null = null;
      let kind: ExrLayerKind = "rgb";
      if (g.has("R") && g.has("G") && g.has("B")) {
        channels = [g.get("R")!, g.get("G")!, g.get("B")!];
        if (g.has("A")) {
          channels.push(g.get("A")!);
          kind = "rgba";
        }
      } else if (g.has("Y")) {
        channels = [g.get("Y")!];
        kind = "grey";
      }
      if (!channels) continue;
      channels.forEach((c) => used.add(c));
      const name = prefix === "" ? "default layer" : `layer ${prefix}`;
      out.push({
        id: `${part.index}/layer:${prefix}`,
        part: part.index,
        partName: part.name,
        kind,
        channels,
        pixelTypes: channels.map((c) => typeOf.get(c)!),
        label: `${partLabel}${name} (${channels.map((c) => splitName(c).suffix).join("")})`,
      });
    }
    for (const c of part.channels) {
      if (used.has(c.name)) continue;
      out.push({
        id: `${part.index}/channel:${c.name}`,
        part: part.index,
        partName: part.name,
        kind: "channel",
        channels: [c.name],
        pixelTypes: [c.pixelType],
        label: `${partLabel}channel ${c.name} (shown as grey)`,
      });
    }
  }
  return out;
}

/**
 * The layer chosen when the uploader names none: RGB(A) of the first part's default layer,
 * else the first colour layer anywhere, else the first luminance layer, else the first channel.
 */
export function defaultLayer(layers: ExrLayer[]): ExrLayer | undefined {
  const colour = (l: ExrLayer) => l.kind === "rgb" || l.kind === "rgba";
  return (
    layers.find((l) => colour(l) && l.id.endsWith("/layer:")) ??
    layers.find(colour) ??
    layers.find((l) => l.kind === "grey") ??
    layers[0]
  );
}

/** Output channel count of a layer: 4, 3, or 1 (grey). */
export function layerChannelCount(layer: ExrLayer): 1 | 3 | 4 {
  return layer.kind === "rgba" ? 4 : layer.kind === "rgb" ? 3 : 1;
}
