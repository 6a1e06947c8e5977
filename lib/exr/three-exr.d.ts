/*
 * The few parts of the `three` package Plateroom uses (it ships no type declarations):
 * the OpenEXR reader and writer from examples/jsm and the constants and texture they take.
 */

declare module "three" {
  export const FloatType: number;
  export const HalfFloatType: number;
  export const RGBAFormat: number;
  export class DataTexture {
    constructor(data: Float32Array | Uint16Array, width: number, height: number, format?: number, type?: number);
    readonly isDataTexture: true;
  }
}

declare module "three/examples/jsm/loaders/EXRLoader.js" {
  export class EXRLoader {
    setDataType(type: number): this;
    setOutputFormat(format: number): this;
    parse(buffer: ArrayBuffer): { width: number; height: number; data: Float32Array; header: Record<string, unknown> };
  }
}

declare module "three/examples/jsm/exporters/EXRExporter.js" {
  import type { DataTexture } from "three";
  export const NO_COMPRESSION: number;
  export const ZIP_COMPRESSION: number;
  export const ZIPS_COMPRESSION: number;
  export const PIZ_COMPRESSION: number;
  export class EXRExporter {
    parse(texture: DataTexture, options?: { type?: number; compression?: number }): Promise<Uint8Array>;
  }
}
