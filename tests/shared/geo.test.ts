import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import geodesic from 'geographiclib-geodesic';
import { haversineKm, roadKm, roadKmMatrix, travelMinutes, HAVERSINE_RADIUS_KM, RURAL_CIRCUITY_FACTOR } from '@shared/calc/geo';

// Points in the interior of the lower 48 states, where the territories lie.
const usInteriorPoint = fc.record({
  lat: fc.double({ min: 30, max: 48, noNaN: true }),
  lng: fc.double({ min: -115, max: -82, noNaN: true }),
});

describe('haversineKm', () => {
  it('when given the published worked example, then it returns 2,887.26 km', () => {
    // Rosetta Code, "Haversine formula" task: (36.12, −86.67) → (33.94, −118.40), R = 6,372.8 km,
    // printed as 2887.26 km, so the check holds to the printed hundredth.
    const km = haversineKm({ lat: 36.12, lng: -86.67 }, { lat: 33.94, lng: -118.4 });
    expect(Math.abs(km - 2887.26)).toBeLessThanOrEqual(0.005);
    expect(HAVERSINE_RADIUS_KM).toBe(6372.8);
  });

  it('when two US interior points are compared with the WGS84 geodesic, then they agree within 0.5 %', () => {
    // Reference: C. F. F. Karney, GeographicLib (npm geographiclib-geodesic), ellipsoidal geodesic in metres.
    fc.assert(
      fc.property(usInteriorPoint, usInteriorPoint, (a, b) => {
        const referenceKm = geodesic.Geodesic.WGS84.Inverse(a.lat, a.lng, b.lat, b.lng).s12! / 1000;
        fc.pre(referenceKm > 0.1); // below 100 m the relative error says nothing useful
        const km = haversineKm(a, b);
        expect(Math.abs(km - referenceKm) / referenceKm).toBeLessThan(0.005);
      }),
      { numRuns: 500 },
    );
  });

  it('when a point is measured to itself or the points are swapped, then it returns 0 and the same distance', () => {
    fc.assert(
      fc.property(usInteriorPoint, usInteriorPoint, (a, b) => {
        expect(haversineKm(a, a)).toBe(0);
        expect(haversineKm(a, b)).toBeCloseTo(haversineKm(b, a), 9);
      }),
    );
  });

  it('when one degree of latitude is measured along a meridian, then it is the radius times π/180', () => {
    // Arc length s = R·Δφ on a sphere: 6,372.8 km × π/180 = 111.226 km (computed by hand).
    expect(haversineKm({ lat: 39, lng: -98 }, { lat: 40, lng: -98 })).toBeCloseTo(111.226, 3);
  });
});

describe('roadKm', () => {
  it('when the default circuity is used, then road distance is 1.2 × the great-circle distance', () => {
    // Wikibooks, Transportation Geography and Network Science / Circuity: about 1.2 is the commonly
    // cited rural value (O'Sullivan 1996: 1.21–1.23).
    expect(RURAL_CIRCUITY_FACTOR).toBe(1.2);
    expect(roadKm(100)).toBeCloseTo(120, 9);
    expect(roadKm(100, 1.23)).toBeCloseTo(123, 9);
  });

  it('when the circuity factor is below 1 or the distance negative, then it throws', () => {
    expect(() => roadKm(10, 0.9)).toThrow(RangeError);
    expect(() => roadKm(-1)).toThrow(RangeError);
  });
});

describe('travelMinutes', () => {
  it('when 120 km are driven at 80 km/h, then it takes 90 minutes', () => {
    // t = d / v: 120 / 80 h = 1.5 h = 90 min (computed by hand).
    expect(travelMinutes(120, 80)).toBeCloseTo(90, 9);
  });

  it('when the speed is zero, negative or not a number, then it throws', () => {
    expect(() => travelMinutes(10, 0)).toThrow(RangeError);
    expect(() => travelMinutes(10, -5)).toThrow(RangeError);
    expect(() => travelMinutes(10, Number.NaN)).toThrow(RangeError);
  });
});

describe('roadKmMatrix', () => {
  it('when built for several points, then each entry is the road distance of that pair and the diagonal is 0', () => {
    fc.assert(
      fc.property(fc.array(usInteriorPoint, { minLength: 1, maxLength: 6 }), (points) => {
        const matrixKm = roadKmMatrix(points, 1.25);
        points.forEach((a, i) =>
          points.forEach((b, j) => {
            expect(matrixKm[i][j]).toBeCloseTo(i === j ? 0 : 1.25 * haversineKm(a, b), 9);
          }),
        );
      }),
    );
  });
});
