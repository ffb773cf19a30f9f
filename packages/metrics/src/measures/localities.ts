/**
 * Practice → locality map, as a Map or a plain object. Localities are listed in the order the
 * map gives them (first appearance); practices absent from the map belong to no locality and
 * count only in the region.
 */
export type LocalityMap = ReadonlyMap<string, string> | Readonly<Record<string, string>>;

export function resolveLocalities(
  practices: readonly string[],
  map: LocalityMap | undefined,
): { localities: string[]; practiceLocality: Int32Array } {
  const entries: [string, string][] =
    map === undefined ? [] : map instanceof Map ? [...map.entries()] : Object.entries(map);
  const localities: string[] = [];
  const localityIndex = new Map<string, number>();
  const ofPractice = new Map<string, number>();
  for (const [practice, locality] of entries) {
    if (typeof locality !== 'string' || locality === '') {
      throw new RangeError(`localities: practice "${practice}" must map to a locality code`);
    }
    let index = localityIndex.get(locality);
    if (index === undefined) {
      index = localities.length;
      localityIndex.set(locality, index);
      localities.push(locality);
    }
    ofPractice.set(practice, index);
  }
  const practiceLocality = new Int32Array(practices.length);
  practices.forEach((code, p) => {
    practiceLocality[p] = ofPractice.get(code) ?? -1;
  });
  return { localities, practiceLocality };
}
