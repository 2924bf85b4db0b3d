// Types for the parts of ndarray-ops (untyped package) that skein uses.
declare module 'ndarray-ops' {
  import type { NdArray } from 'ndarray';
  export function assign(out: NdArray, a: NdArray): NdArray;
  export function assigns(out: NdArray, s: number): NdArray;
  export function addeq(out: NdArray, a: NdArray): NdArray;
  export function subeq(out: NdArray, a: NdArray): NdArray;
  export function mul(out: NdArray, a: NdArray, b: NdArray): NdArray;
  export function muls(out: NdArray, a: NdArray, s: number): NdArray;
  export function mulseq(out: NdArray, s: number): NdArray;
  export function abs(out: NdArray, a: NdArray): NdArray;
  export function sum(a: NdArray): number;
  export function sup(a: NdArray): number;
  export function inf(a: NdArray): number;
  export function argmax(a: NdArray): number[];
  export function argmin(a: NdArray): number[];
  export function norm2squared(a: NdArray): number;
  export function norminf(a: NdArray): number;
  export function equals(a: NdArray, b: NdArray): boolean;
}
