// Double-double arithmetic without allocation: each operation writes its
// result into a cell { h, l } the caller owns. For loops that run once per
// row and entry (the extended evaluation of a model, exp's series), where a
// new pair per operation would spend most of the time allocating and
// collecting. The algorithms are those of double-double.ts: Dekker's product
// with the cross terms, the QD library's accurate addition, a division with
// one correction (relative error ~1e-32).

const SPLITTER = 134217729; // 2^27 + 1: Dekker's splitting constant

export interface DDCell {
  h: number;
  l: number;
}

export function newCell(): DDCell {
  return { h: 0, l: 0 };
}

/** out = (ah + al)(bh + bl). */
export function mulTo(out: DDCell, ah: number, al: number, bh: number, bl: number): void {
  const p = ah * bh;
  let t = SPLITTER * ah;
  const a1 = t - (t - ah);
  const a2 = ah - a1;
  t = SPLITTER * bh;
  const b1 = t - (t - bh);
  const b2 = bh - b1;
  const e = a1 * b1 - p + a1 * b2 + a2 * b1 + a2 * b2 + (ah * bl + al * bh);
  const h = p + e;
  out.h = h;
  out.l = e - (h - p);
}

/** out = (ah + al) + (bh + bl). */
export function addTo(out: DDCell, ah: number, al: number, bh: number, bl: number): void {
  const s = ah + bh;
  const sb = s - ah;
  const e = ah - (s - sb) + (bh - sb);
  const t = al + bl;
  const tb = t - al;
  const f = al - (t - tb) + (bl - tb);
  const e1 = e + t;
  const h1 = s + e1;
  const l1 = e1 - (h1 - s) + f;
  const h = h1 + l1;
  out.h = h;
  out.l = l1 - (h - h1);
}

/** out = (ah + al) / (bh + bl): q1 = a/b, then q2 = (a - q1 b)/b with q1 bh exact. */
export function divTo(out: DDCell, ah: number, al: number, bh: number, bl: number): void {
  const q1 = ah / bh;
  mulTo(out, q1, 0, bh, 0); // q1 bh exactly, as out.h + out.l
  const r = ah - out.h - out.l + al - q1 * bl;
  const q2 = r / bh;
  const h = q1 + q2;
  out.h = h;
  out.l = q2 - (h - q1);
}
