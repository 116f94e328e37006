/**
 * The DXF writer, read back by dxf-parser (npm, a general-purpose DXF reader).
 * Check values: ../shared/REFERENCES.md §12.2–12.3 (D3: the NIST G1 arc as an
 * ARC entity; angles counter-clockwise in degrees, Autodesk DXF reference).
 */
import { describe, expect, it } from 'vitest';
import DxfParserModule from 'dxf-parser';
import { DxfWriter, aciOf, layerName } from '../../src/write/dxf.js';

const DxfParser = DxfParserModule as unknown as new () => { parseSync(t: string): any };
const read = (t: string): any => new DxfParser().parseSync(t);

describe('DXF writer', () => {
  it('D3: the clockwise arc (7,7) → (10,16) about (10,11) is ARC centre (10,11), r 5, 90° → 233.130102°', () => {
    const w = new DxfWriter(4);
    w.beginElement({ index: 1, label: 'a', group: '#000000' });
    w.moveTo(7, 7);
    w.arcTo(10, 16, 10, 11, false);
    const text = w.toString();
    // Angle decimals: enough that rounding moves an end by at most half a unit of the 4th decimal (r = 5: 3 decimals).
    expect(text).toContain('\n50\n90\n51\n233.13\n');
    const [arc] = read(text).entities;
    expect(arc.type).toBe('ARC');
    expect(arc.center).toMatchObject({ x: 10, y: 11 });
    expect(arc.radius).toBeCloseTo(5, 12);
    expect((arc.startAngle * 180) / Math.PI).toBeCloseTo(90, 9);
    expect(Math.abs((arc.endAngle * 180) / Math.PI - 233.130102) * (Math.PI / 180) * 5).toBeLessThanOrEqual(0.5e-4);
  });

  it('the same arc counter-clockwise runs from angle(start) to angle(end)', () => {
    const w = new DxfWriter(4);
    w.beginElement({ index: 1, label: 'a', group: '#000000' });
    w.moveTo(10, 16);
    w.arcTo(7, 7, 10, 11, true);
    const [arc] = read(w.toString()).entities;
    expect((arc.startAngle * 180) / Math.PI).toBeCloseTo(90, 9);
    expect((arc.endAngle * 180) / Math.PI).toBeCloseTo(233.13, 9);
  });

  it('an angle a hair under 360° is written 0, not 360 (group codes 50/51 are in [0°, 360°): Autodesk DXF reference)', () => {
    const w = new DxfWriter(3);
    w.beginElement({ index: 1, label: 'a', group: '#000000' });
    // The centre is put on the rounded chord's bisector: a centre given a hair above the x axis lands there,
    // so the start (10, 0) sits at an angle of about −3e-9°, which rounds up to 360.
    w.moveTo(10, 0);
    w.arcTo(0, 10, 0, 1e-9, true);
    const text = w.toString();
    expect(text).toContain('\n50\n0\n51\n90\n');
    expect(text).not.toMatch(/\n5[01]\n360\n/);
  });

  it('millimetres in the header ($INSUNITS 4), AC1009, one layer per stroke colour with its nearest basic colour', () => {
    const w = new DxfWriter(3);
    w.beginElement({ index: 1, label: 'a', group: '#ff0000' });
    w.moveTo(0, 0);
    w.lineTo(10, 0);
    w.beginElement({ index: 2, label: 'b', group: '#000000' });
    w.moveTo(0, 5);
    w.lineTo(10, 5);
    w.beginElement({ index: 3, label: 'c', group: '#ff0000' });
    w.moveTo(0, 9);
    w.lineTo(10, 9);
    const d = read(w.toString());
    expect(d.header.$INSUNITS).toBe(4);
    expect(d.header.$ACADVER).toBe('AC1009');
    expect(Object.keys(d.tables.layer.layers).sort()).toEqual(['STROKE_000000', 'STROKE_FF0000']);
    expect(d.tables.layer.layers.STROKE_FF0000.colorIndex).toBe(1);
    expect(d.entities.map((e: any) => e.layer)).toEqual(['STROKE_FF0000', 'STROKE_000000', 'STROKE_FF0000']);
    expect(w.spans).toEqual([{ key: 1, first: 0, count: 1 }, { key: 2, first: 1, count: 1 }, { key: 3, first: 2, count: 1 }]);
  });

  it('only R12 entities: LINE and ARC, no handles or subclass markers', () => {
    const w = new DxfWriter(3);
    w.beginElement({ index: 1, label: 'a', group: 'none' });
    w.moveTo(0, 0);
    w.lineTo(10, 0);
    w.arcTo(0, 0, 5, 0, true);
    const t = w.toString();
    // The file is pairs of lines, group code then value; code 0 starts an entity or a section marker.
    const lines = t.split('\n');
    const types = lines.filter((_, i) => i % 2 === 1 && lines[i - 1] === '0');
    expect(new Set(types)).toEqual(new Set(['SECTION', 'ENDSEC', 'TABLE', 'LAYER', 'ENDTAB', 'LINE', 'ARC', 'EOF']));
    const codes = new Set(lines.filter((_, i) => i % 2 === 0 && i < lines.length - 1));
    expect(codes.has('5') || codes.has('100')).toBe(false);
    expect(layerName('none')).toBe('STROKE_NONE');
    expect(aciOf('#0000fe')).toBe(5);
  });
});
