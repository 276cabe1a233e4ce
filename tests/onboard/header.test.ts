/**
 * Header recognition of `rateloom new`: the column patterns of lab exports (common practice) and
 * units read from brackets, parentheses, ' / ', unit suffixes and comment lines.
 */
import { describe, expect, it } from 'vitest';
import { recogniseColumn, splitHeader } from '../../src/index';
import { unitHints } from '../../src/onboard/header';
import { rateConstantUnit } from '../../src/onboard/rate-units';
import { compoundToSI } from '../../src/index';

describe('header recognition', () => {
  const table: [string, string, string | undefined, string?][] = [
    // header, role (amount: kind of species side), unit
    ['run', 'run', undefined],
    ['Run ID', 'run', undefined],
    ['T [degC]', 'temperature', 'degC'],
    ['Temperature (°C)', 'temperature', 'degC'],
    ['T_K', 'temperature', 'K'],
    ['P_bar', 'pressure', 'bar'],
    ['P (psia)', 'pressure', 'psia'],
    ['W / g', 'catalystMass', 'g'],
    ['m_cat [mg]', 'catalystMass', 'mg'],
    ['V (L)', 'volume', 'L'],
    ['t [min]', 'time', 'min'],
    ['Q_mL_min', 'volumetricFlow', 'mL/min'],
    ['Rep', 'replicate', undefined],
    ['species', 'species', undefined],
    ['F_A,out (mol/min)', 'molar-flow A out', 'mol/min'],
    ['F_A,in (mmol/min)', 'molar-flow A in', 'mmol/min'],
    ['F_C2H4_in', 'molar-flow C2H4 in', undefined],
    ['F_EtOH', 'molar-flow EtOH out', undefined],
    ['C_AcOH_0', 'concentration AcOH in', undefined],
    ['CA0', 'concentration A in', undefined],
    ['C_A [mol/L]', 'concentration A out', 'mol/L'],
    ['C_CO2_out', 'concentration CO2 out', undefined],
    ['[B]', 'concentration B out', undefined],
    ['C_in (mol/L)', 'concentration - in', 'mol/L'],
    ['C_molL', 'concentration - out', 'mol/L'],
    ['y_A,in', 'fraction A in', undefined],
  ];
  it.each(table)('%s -> %s [%s]', (header, role, unit) => {
    const c = recogniseColumn(header);
    expect(c).toBeDefined();
    const got = c?.role === 'amount' ? `${c.amount?.kind} ${c.amount?.species ?? '-'} ${c.amount?.side}` : c?.role;
    expect(got).toBe(role);
    expect(c?.unit).toBe(unit);
  });

  it('leaves unknown headers unrecognised', () => {
    for (const h of ['a', 'comment', 'operator', 'CO2', 'c']) expect(recogniseColumn(h)).toBeUndefined();
  });

  it('splits the unit off in the usual ways', () => {
    expect(splitHeader('T [degC]')).toEqual({ name: 'T', unit: 'degC' });
    expect(splitHeader('F_A,out (mol/min)')).toEqual({ name: 'F_A,out', unit: 'mol/min' });
    expect(splitHeader('W / g')).toEqual({ name: 'W', unit: 'g' });
    expect(splitHeader('flow in mL/min')).toEqual({ name: 'flow', unit: 'mL/min' });
  });

  it('reads units from comment lines by the quantity they measure', () => {
    const h = unitHints(['Pilot bed; flows in mmol/min, absolute pressure in bar, catalyst mass in g.', 'feed flow in mL/min']);
    expect(h.get('molar-flow')).toBe('mmol/min');
    expect(h.get('pressure')).toBe('bar');
    expect(h.get('mass')).toBe('g');
    expect(h.get('volumetric-flow')).toBe('mL/min');
  });
});

describe('rate-constant units from the user units', () => {
  // Dimensions of k = r / prod C^a: mass basis r in mol/(kg s), C in mol/m3 -> m^(3n) mol^(1-n) / (kg s).
  it.each([
    [1, 'mass', { volume: 'L', mass: 'g', time: 'min' }, 'L/(g min)', 'm^3/(kg s)'],
    [2, 'mass', { volume: 'L', mass: 'g', time: 'min' }, 'L^2/(mol g min)', 'm^6/(kg s mol)'],
    [1.5, 'mass', { volume: 'm3', mass: 'kg', time: 's' }, 'm^4.5/(mol^0.5 kg s)', 'm^4.5/(kg s mol^0.5)'],
    [0.5, 'volume', { volume: 'L', mass: 'kg', time: 'h' }, 'mol^0.5/(L^0.5 h)', 'mol^0.5/(m^1.5 s)'],
    [1, 'volume', { volume: 'L', mass: 'kg', time: 'min' }, '1/min', '1/s'],
  ] as const)('order %s, %s basis', (n, basis, u, unit, si) => {
    expect(rateConstantUnit(n, basis, u)).toBe(unit);
    expect(compoundToSI(1, unit).unit).toBe(si);
  });
});
