/**
 * Which hazard areas the inspector has confirmed blue-signal protection for, per inspection.
 * Kept in sessionStorage so a reload does not ask again, while a new inspection always asks.
 */
const key = (inspectionId: string) => `hoodline.walk.blue.${inspectionId}`;

export function readAcks(inspectionId: string): string[] {
  try {
    const v = JSON.parse(sessionStorage.getItem(key(inspectionId)) ?? '[]');
    return Array.isArray(v) ? v.filter((x): x is string => typeof x === 'string') : [];
  } catch {
    return [];
  }
}

export function writeAck(inspectionId: string, areaKey: string): string[] {
  const next = [...new Set([...readAcks(inspectionId), areaKey])];
  try {
    sessionStorage.setItem(key(inspectionId), JSON.stringify(next));
  } catch {
    // Private mode without storage: the acknowledgement lasts for this page only.
  }
  return next;
}
