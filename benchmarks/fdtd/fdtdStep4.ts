/**
 * An experiment, not part of the engine: core's `fdtdStep` specialised by hand for n = 4
 * conductors (matrices held in locals, loops over conductors unrolled, no scratch copy). It
 * shows what limits the generic TS loop against C for n > 1 (see README). Same scheme and update
 * order per cell; the sums are grouped differently (A x - (B d) instead of one running sum), so
 * results agree with `fdtdStep` to rounding, not bit for bit (tested to 1e-12).
 * @param cells N; the arrays as for fdtdStep with n = 4.
 * @returns the number of cells updated.
 * @example fdtdStep4(f.cells, f.Av, f.Bv, f.Ai, f.Bi, f.gm, f.V, f.I, f.iEnd, f.hEnd)
 */
export function fdtdStep4(
  cells: number, Av: Float64Array, Bv: Float64Array, Ai: Float64Array, Bi: Float64Array, gm: Float64Array,
  V: Float64Array, I: Float64Array, iEnd: Float64Array, hEnd: Float64Array,
): number {
  const a00=Ai[0],a01=Ai[1],a02=Ai[2],a03=Ai[3],a10=Ai[4],a11=Ai[5],a12=Ai[6],a13=Ai[7],a20=Ai[8],a21=Ai[9],a22=Ai[10],a23=Ai[11],a30=Ai[12],a31=Ai[13],a32=Ai[14],a33=Ai[15];
  const b00=Bi[0],b01=Bi[1],b02=Bi[2],b03=Bi[3],b10=Bi[4],b11=Bi[5],b12=Bi[6],b13=Bi[7],b20=Bi[8],b21=Bi[9],b22=Bi[10],b23=Bi[11],b30=Bi[12],b31=Bi[13],b32=Bi[14],b33=Bi[15];
  for (let k = 0; k < cells; k++) {
    const o = k * 4;
    const i0=I[o],i1=I[o+1],i2=I[o+2],i3=I[o+3];
    const d0=V[o+4]-V[o],d1=V[o+5]-V[o+1],d2=V[o+6]-V[o+2],d3=V[o+7]-V[o+3];
    I[o]=a00*i0+a01*i1+a02*i2+a03*i3-(b00*d0+b01*d1+b02*d2+b03*d3);
    I[o+1]=a10*i0+a11*i1+a12*i2+a13*i3-(b10*d0+b11*d1+b12*d2+b13*d3);
    I[o+2]=a20*i0+a21*i1+a22*i2+a23*i3-(b20*d0+b21*d1+b22*d2+b23*d3);
    I[o+3]=a30*i0+a31*i1+a32*i2+a33*i3-(b30*d0+b31*d1+b32*d2+b33*d3);
  }
  const c00=Av[0],c01=Av[1],c02=Av[2],c03=Av[3],c10=Av[4],c11=Av[5],c12=Av[6],c13=Av[7],c20=Av[8],c21=Av[9],c22=Av[10],c23=Av[11],c30=Av[12],c31=Av[13],c32=Av[14],c33=Av[15];
  const e00=Bv[0],e01=Bv[1],e02=Bv[2],e03=Bv[3],e10=Bv[4],e11=Bv[5],e12=Bv[6],e13=Bv[7],e20=Bv[8],e21=Bv[9],e22=Bv[10],e23=Bv[11],e30=Bv[12],e31=Bv[13],e32=Bv[14],e33=Bv[15];
  for (let k = 1; k < cells; k++) {
    const o = k * 4;
    const v0=V[o],v1=V[o+1],v2=V[o+2],v3=V[o+3];
    const d0=I[o]-I[o-4],d1=I[o+1]-I[o-3],d2=I[o+2]-I[o-2],d3=I[o+3]-I[o-1];
    V[o]=c00*v0+c01*v1+c02*v2+c03*v3-(e00*d0+e01*d1+e02*d2+e03*d3);
    V[o+1]=c10*v0+c11*v1+c12*v2+c13*v3-(e10*d0+e11*d1+e12*d2+e13*d3);
    V[o+2]=c20*v0+c21*v1+c22*v2+c23*v3-(e20*d0+e21*d1+e22*d2+e23*d3);
    V[o+3]=c30*v0+c31*v1+c32*v2+c33*v3-(e30*d0+e31*d1+e32*d2+e33*d3);
  }
  // End histories, as in fdtdStep.
  const oN = cells * 4;
  const oI = (cells - 1) * 4;
  for (let a = 0; a < 4; a++) {
    let s0 = 0;
    let sN = 0;
    for (let b = 0; b < 4; b++) {
      s0 += gm[a * 4 + b] * V[b];
      sN += gm[a * 4 + b] * V[oN + b];
    }
    hEnd[a] = -(s0 + iEnd[a] - 2 * I[a]);
    hEnd[4 + a] = -(sN + iEnd[4 + a] + 2 * I[oI + a]);
  }
  return cells;
}
