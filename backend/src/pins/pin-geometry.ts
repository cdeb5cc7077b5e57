import { PIN_LIMITS, type PinGeometry, type PinPoint, SETUP_LIMITS } from '@fieldbound/shared';

export type GeometryCheck = { ok: true; geometry: PinGeometry } | { ok: false; errors: Record<string, string[]> };

function isObject(value: unknown): value is Record<string, unknown> {
  return value !== null && typeof value === 'object' && !Array.isArray(value);
}

/**
 * Checks a pin geometry from a request: a point, a rectangle or a polygon of 3…200 vertices, every
 * coordinate a finite positive number inside the setup limits (α in a₀³, B in tesla). Errors are keyed
 * by path (`geometry.vertices.2.alpha`); on success a clean copy holding only the known fields is returned.
 */
export function checkPinGeometry(value: unknown, path = 'geometry'): GeometryCheck {
  const errors: Record<string, string[]> = {};
  const add = (at: string, message: string) => (errors[at] ??= []).push(message);
  const onlyKeys = (obj: Record<string, unknown>, at: string, keys: string[]) => {
    for (const key of Object.keys(obj)) if (!keys.includes(key)) add(`${at}.${key}`, 'This field is not expected here.');
  };
  const coordinate = (v: unknown, at: string, what: string, unit: string, limits: { min: number; max: number }): number | null => {
    if (typeof v !== 'number' || !Number.isFinite(v)) add(at, `${what} must be a finite number (${unit}).`);
    else if (v <= 0) add(at, `${what} must be greater than zero.`);
    else if (v < limits.min || v > limits.max) add(at, `${what} must lie between ${limits.min} and ${limits.max} ${unit}.`);
    else return v;
    return null;
  };
  const point = (v: unknown, at: string): PinPoint | null => {
    if (!isObject(v)) {
      add(at, 'A point is { alpha (a0^3), fieldTesla (T) }.');
      return null;
    }
    onlyKeys(v, at, ['alpha', 'fieldTesla']);
    const alpha = coordinate(v.alpha, `${at}.alpha`, 'alpha', 'a0^3', SETUP_LIMITS.alpha);
    const fieldTesla = coordinate(v.fieldTesla, `${at}.fieldTesla`, 'fieldTesla', 'T', SETUP_LIMITS.fieldTesla);
    return alpha === null || fieldTesla === null ? null : { alpha, fieldTesla };
  };

  if (!isObject(value)) {
    add(path, 'The geometry must be a point, a rect or a polygon.');
    return { ok: false, errors };
  }
  let geometry: PinGeometry | null = null;
  switch (value.kind) {
    case 'point': {
      onlyKeys(value, path, ['kind', 'at']);
      const at = point(value.at, `${path}.at`);
      if (at) geometry = { kind: 'point', at };
      break;
    }
    case 'rect': {
      onlyKeys(value, path, ['kind', 'min', 'max']);
      const min = point(value.min, `${path}.min`);
      const max = point(value.max, `${path}.max`);
      if (min && max) {
        if (!(min.alpha < max.alpha)) add(`${path}.max.alpha`, 'The rectangle is inverted or empty: max.alpha must be above min.alpha.');
        if (!(min.fieldTesla < max.fieldTesla)) add(`${path}.max.fieldTesla`, 'The rectangle is inverted or empty: max.fieldTesla must be above min.fieldTesla.');
        geometry = { kind: 'rect', min, max };
      }
      break;
    }
    case 'polygon': {
      onlyKeys(value, path, ['kind', 'vertices']);
      const vertices = value.vertices;
      if (!Array.isArray(vertices)) {
        add(`${path}.vertices`, 'A polygon needs a list of vertices.');
      } else if (vertices.length < PIN_LIMITS.minPolygonVertices || vertices.length > PIN_LIMITS.maxPolygonVertices) {
        add(`${path}.vertices`, `A polygon has ${PIN_LIMITS.minPolygonVertices} to ${PIN_LIMITS.maxPolygonVertices} vertices; this one has ${vertices.length}.`);
      } else {
        const points = vertices.map((v, i) => point(v, `${path}.vertices.${i}`));
        if (points.every((p): p is PinPoint => p !== null)) geometry = { kind: 'polygon', vertices: points };
      }
      break;
    }
    default:
      add(`${path}.kind`, 'kind must be "point", "rect" or "polygon".');
  }
  return Object.keys(errors).length === 0 && geometry ? { ok: true, geometry } : { ok: false, errors };
}
