/** What the open-data benchmarks (open-cities.ts, open-airports.ts) share: distance and figures. */
import { figuresOf } from "../src/evaluate/metrics.js";

/** Mean radius of the Earth, km (the usual value). */
const EARTH_KM = 6371;

/** Distance in km on a locally flat Earth (equirectangular): exact enough within a few km. */
export function km(lat1: number, lon1: number, lat2: number, lon2: number): number {
  const r = Math.PI / 180;
  const x = (lon2 - lon1) * r * Math.cos(((lat1 + lat2) / 2) * r);
  const y = (lat2 - lat1) * r;
  return EARTH_KM * Math.sqrt(x * x + y * y);
}

/** The figures these benchmarks print, to three decimals (see src/evaluate/metrics.ts). */
export function scores(gold: ReadonlyArray<string | null>, predicted: ReadonlyArray<string | null>) {
  const f = figuresOf(gold, predicted);
  const r3 = (x: number) => Math.round(x * 1000) / 1000;
  return {
    accuracy: r3(f.accuracy),
    precision: r3(f.linkPrecision),
    recall: r3(f.linkRecall),
    f1: r3(f.linkF1),
    wrongLinks: f.predictedLinks - f.correctLinks,
  };
}
