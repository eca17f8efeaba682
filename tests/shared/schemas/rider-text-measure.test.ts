import { describe, expect, it } from 'vitest';
import { PARAMETER_INFO } from '@shared/fit/setup';
import { idSchema, lengthUnitSchema, measureSchema, plainText, roundMm, setupInUnitSchema, strictShape, unitUnionError } from '@shared/rider';
import { z } from 'zod';
import { problems } from './problems';

const notes = plainText('cleat notes', 20);

describe('plainText', () => {
  it('trims the text a rider typed', () => {
    expect(notes.parse('  left cleat 2 mm back \n')).toBe('left cleat 2 mm back');
  });

  it('keeps line breaks, tabs and comparisons such as "< 2 weeks" and "pain <5"', () => {
    expect(notes.parse('< 2 weeks\tpain <5')).toBe('< 2 weeks\tpain <5');
    expect(notes.parse('a\r\nb')).toBe('a\r\nb');
    expect(notes.parse('3 > 2')).toBe('3 > 2');
  });

  it('refuses anything that is not text', () => {
    expect(problems(notes, 42)).toEqual({ '': 'Enter the cleat notes as text.' });
    expect(problems(notes, null)).toEqual({ '': 'Enter the cleat notes as text.' });
  });

  it('refuses text longer than the limit after trimming', () => {
    expect(notes.parse(`  ${'x'.repeat(20)}  `)).toHaveLength(20);
    expect(problems(notes, 'x'.repeat(21))).toEqual({ '': 'The cleat notes can be at most 20 characters.' });
  });

  it.each(['<script>x</script>', '</p>', '<!-- hi -->', '< img src=x>', '<?xml?>'])('refuses markup such as %s', (text) => {
    expect(problems(notes, text)).toEqual({ '': 'Please leave HTML tags such as <script> out of the cleat notes.' });
  });

  it.each(['a\u0000b', 'bell\u0007', 'esc\u001b[0m', 'del\u007f'])('refuses control characters in %j', (text) => {
    expect(problems(notes, text)).toEqual({ '': 'The cleat notes cannot contain control characters.' });
  });
});

describe('strictShape', () => {
  const form = strictShape({ name: z.string() }, 'the bike');

  it('accepts exactly the named fields', () => {
    expect(form.parse({ name: 'Blue' })).toEqual({ name: 'Blue' });
  });

  it('names every unexpected field', () => {
    expect(problems(form, { name: 'Blue', admin: true, role: 'x' })).toEqual({ '': 'Unexpected field: admin, role.' });
  });

  it('asks for named fields when the value is not an object', () => {
    expect(problems(form, 'Blue')).toEqual({ '': 'Send the bike as a set of named fields.' });
    expect(problems(strictShape({}), [])).toEqual({ '': 'Send the form as a set of named fields.' });
  });

  it('leaves the messages of the fields themselves alone', () => {
    expect(problems(strictShape({ n: z.number({ error: 'A number, please.' }) }), { n: 'x' })).toEqual({ n: 'A number, please.' });
  });
});

describe('unitUnionError', () => {
  const error = unitUnionError('the setup');

  it('asks for named fields when the input is missing, a list or not an object', () => {
    expect(error({ input: undefined })).toBe('Send the setup as a set of named fields.');
    expect(error({ input: null })).toBe('Send the setup as a set of named fields.');
    expect(error({ input: [] })).toBe('Send the setup as a set of named fields.');
    expect(error({ input: 'mm' })).toBe('Send the setup as a set of named fields.');
  });

  it('asks for the unit when an object came without a known one', () => {
    expect(error({ input: { unit: 'cm' } })).toBe('Choose mm or in as the unit.');
  });
});

describe('idSchema', () => {
  it('accepts positive whole ids up to the database maximum', () => {
    expect(idSchema.parse(1)).toBe(1);
    expect(idSchema.parse(4_294_967_295)).toBe(4_294_967_295);
  });

  it.each([0, -3, 1.5, 4_294_967_296, '7', null])('refuses %j as an id', (value) => {
    expect(problems(idSchema, value)).toEqual({ '': 'Expected an id number.' });
  });
});

describe('lengthUnitSchema', () => {
  it('knows mm and in only', () => {
    expect(lengthUnitSchema.parse('in')).toBe('in');
    expect(problems(lengthUnitSchema, 'cm')).toEqual({ '': 'Choose mm or in as the unit.' });
  });
});

describe('roundMm', () => {
  it('stores lengths to a tenth of a millimetre', () => {
    expect(roundMm(172.54)).toBe(172.5);
    expect(roundMm(172.56)).toBe(172.6);
    expect(roundMm(-12.34)).toBe(-12.3);
    expect(roundMm(700)).toBe(700);
  });

  it('rounds inch conversions as on paper, not by their binary artefacts', () => {
    // 29.25 in is 742.95 mm, held in floating point as 742.9499…
    expect(29.25 * 25.4).toBeLessThan(742.95);
    expect(roundMm(29.25 * 25.4)).toBe(743);
    expect(roundMm(1.005 * 100)).toBe(100.5);
  });
});

describe('measureSchema', () => {
  const height = PARAMETER_INFO.saddleHeight;
  const tilt = PARAMETER_INFO.saddleTilt;

  it('keeps millimetres, rounded to a tenth', () => {
    expect(measureSchema(height, 'mm').parse(742.96)).toBe(743);
  });

  it('converts inches to millimetres before storing', () => {
    expect(measureSchema(height, 'in').parse(29.25)).toBe(743);
    expect(measureSchema(PARAMETER_INFO.crankLength, 'in').parse(6.79)).toBe(172.5);
  });

  it('leaves degrees alone whatever length unit was chosen', () => {
    expect(measureSchema(tilt, 'in').parse(-1.5)).toBe(-1.5);
    expect(measureSchema(tilt, 'mm').parse(2.04)).toBe(2);
  });

  it('checks the limits on the converted value and quotes them in the unit typed', () => {
    expect(problems(measureSchema(height, 'mm'), 250)).toEqual({ '': 'The saddle height must be at least 300 mm.' });
    expect(problems(measureSchema(height, 'mm'), 1100.1)).toEqual({ '': 'The saddle height must be at most 1100 mm.' });
    expect(problems(measureSchema(height, 'in'), 11)).toEqual({ '': 'The saddle height must be at least 11.81 in.' });
    expect(problems(measureSchema(height, 'in'), 44)).toEqual({ '': 'The saddle height must be at most 43.31 in.' });
    expect(measureSchema(height, 'in').parse(11.82)).toBe(300.2);
  });

  it('quotes angle limits in degrees', () => {
    expect(problems(measureSchema(tilt, 'in'), 25)).toEqual({ '': 'The saddle tilt must be at most 20°.' });
    expect(problems(measureSchema(tilt, 'mm'), -21)).toEqual({ '': 'The saddle tilt must be at least -20°.' });
  });

  it.each(['700', null, Number.NaN, Number.POSITIVE_INFINITY])('refuses %s as a measurement', (value) => {
    expect(problems(measureSchema(height, 'mm'), value)).toEqual({ '': 'Enter the saddle height as a number.' });
  });
});

describe('setupInUnitSchema', () => {
  const inches = { saddleHeight: 29.25, saddleSetback: 2.5, saddleTilt: -1.5, reach: 20, drop: 3, stemLength: 4, spacerStack: 1, crankLength: 6.79, stack: 0.8, cleatForeAft: 0, cleatRotation: 3 };

  it('turns a setup typed in inches into millimetres, degrees unchanged', () => {
    expect(setupInUnitSchema('in').parse(inches)).toEqual({
      saddleHeight: 743, saddleSetback: 63.5, saddleTilt: -1.5, reach: 508, drop: 76.2, stemLength: 101.6,
      spacerStack: 25.4, crankLength: 172.5, stack: 20.3, cleatForeAft: 0, cleatRotation: 3,
    });
  });

  it('names each missing or wrong parameter', () => {
    const { stemLength: _omit, ...rest } = inches;
    expect(problems(setupInUnitSchema('in'), { ...rest, saddleSetback: 12 })).toEqual({
      saddleSetback: 'The saddle setback must be at most 9.84 in.',
      stemLength: 'Enter the stem length as a number.',
    });
  });

  it('refuses unknown fields by name', () => {
    expect(problems(setupInUnitSchema('in'), { ...inches, seatPost: 3 })).toEqual({ '': 'Unexpected setup field: seatPost.' });
  });

  it('asks for the whole setup when something else is sent', () => {
    expect(problems(setupInUnitSchema('mm'), null)).toEqual({ '': 'Enter the bike setup: saddle height, setback, tilt, reach, drop and the rest.' });
  });
});
