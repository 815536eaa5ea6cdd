import { describe, expect, it } from 'vitest'
import {
  MODIFIED_ELASTOMERIC_PROTOCOL,
  STANDARD_PROTOCOL,
  computeFitTest,
  detectDelimiter,
  mulberry32,
  parseCountSeries,
  protocolSchema,
  protocolTimeline,
  readCountSeries,
  segmentsToFitTestInputs
} from '#shared/utils/compute'
import type { Protocol } from '#shared/utils/compute'
import { readTypedNumber } from '#shared/utils/number-reader'

// A 1 Hz long-layout series that follows the protocol's timeline: ambient readings during
// ambient phases, mask readings otherwise. Demo values, invented.
function seriesFor(protocol: Protocol, ambient = 2000, mask = 4, hz = 1): string {
  const phases = protocolTimeline(protocol).exercises.flatMap(w => w.phases)
  const lines = ['t,channel,conc']
  const total = protocolTimeline(protocol).durationSeconds * hz
  for (let i = 0; i < total; i++) {
    const t = i / hz
    const phase = phases.find(p => t >= p.startSeconds && t < p.endSeconds)!
    const channel = phase.kind === 'ambient' ? 'ambient' : 'mask'
    lines.push(`${t},${channel},${channel === 'ambient' ? ambient : mask}`)
  }
  return lines.join('\n')
}

describe('reading a count series', () => {
  it('reads the long layout with a header and finds the sample period', () => {
    const r = readCountSeries('t,channel,conc\n0,ambient,1000\n1,ambient,1002.5\n2,mask,3.25\n')
    expect(r.issues).toEqual([])
    expect(r.layout).toBe('long')
    expect(r.hasHeader).toBe(true)
    expect(r.samplePeriodSeconds).toBe(1)
    expect(r.readings).toEqual([
      { row: 2, seconds: 0, channel: 'ambient', concentration: 1000 },
      { row: 3, seconds: 1, channel: 'ambient', concentration: 1002.5 },
      { row: 4, seconds: 2, channel: 'mask', concentration: 3.25 }
    ])
  })

  it.each([
    { case: 'tabs, no header', text: '0\tambient\t1000\n1\tmask\t2', delimiter: '\t', decimalMark: 'point' as const },
    { case: 'semicolons with decimal commas', text: 't;channel;conc\n0;ambient;1000,5\n1;mask;2,25', delimiter: ';', decimalMark: 'comma' as const },
    { case: 'commas, Windows line ends', text: 't,channel,conc\r\n0,ambient,1000.5\r\n1,mask,2.25\r\n', delimiter: ',', decimalMark: 'point' as const }
  ])('detects $case', ({ text, delimiter, decimalMark }) => {
    const r = readCountSeries(text, { decimalMark })
    expect(r.delimiter).toBe(delimiter)
    expect(r.issues).toEqual([])
    expect(r.readings.map(x => x.concentration)).toEqual(delimiter === '\t' ? [1000, 2] : [1000.5, 2.25])
  })

  it('reads the wide layout, with or without a header, and blank cells', () => {
    const withHeader = readCountSeries('t,ambient,mask\n0,1000,\n1,,2.5\n2,1001,2.4')
    const without = readCountSeries('0,1000,\n1,,2.5\n2,1001,2.4')
    for (const r of [withHeader, without]) {
      expect(r.layout).toBe('wide')
      expect(r.issues).toEqual([])
      expect(r.readings.map(x => `${x.seconds}:${x.channel}:${x.concentration}`)).toEqual(['0:ambient:1000', '1:mask:2.5', '2:ambient:1001', '2:mask:2.4'])
    }
  })

  it('turns ISO-8601 timestamps into seconds from the first one', () => {
    const r = readCountSeries('time,channel,conc\n2025-03-04T09:15:00Z,ambient,900\n2025-03-04T09:15:01.5Z,mask,3')
    expect(r.timeFormat).toBe('iso')
    expect(r.readings.map(x => x.seconds)).toEqual([0, 1.5])
  })

  it('ignores a byte-order mark from a spreadsheet export', () => {
    const r = readCountSeries('\uFEFFt,channel,conc\n0,ambient,800')
    expect(r.issues).toEqual([])
    expect(r.readings).toHaveLength(1)
  })

  it('accepts header names with units and in any case', () => {
    const r = readCountSeries('Time (s),Channel,Conc (1/cm³)\n0,AMBIENT,800\n1,In-Mask,2')
    expect(r.issues).toEqual([])
    expect(r.readings.map(x => x.channel)).toEqual(['ambient', 'mask'])
  })

  it.each([
    { text: 't,channel,conc\n0,ambient,abc', row: 2, column: 3, code: 'not-a-number', message: 'Row 2, column 3 (concentration): \'abc\' has letters or signs in it: type the number only, without units.' },
    { text: 't,channel,conc\n0,ambient,-4', row: 2, column: 3, code: 'negative', message: 'Row 2, column 3: concentration cannot be negative (-4)' },
    { text: 't,channel,conc\n0,ambient,0x1f', row: 2, column: 3, code: 'not-a-number', message: 'Row 2, column 3 (concentration): \'0x1f\' looks like a hexadecimal, octal or binary number: type the reading in decimal digits.' },
    { text: 't;channel;conc\n0;ambient;1,5', row: 2, column: 3, code: 'not-a-number', message: 'Row 2, column 3 (concentration): \'1,5\' is ambiguous: write 1.5 or 15.' },
    { text: 't\tambient\tmask\n0\t8000\t1,23', row: 2, column: 3, code: 'not-a-number', message: 'Row 2, column 3 (mask concentration): \'1,23\' is ambiguous: write 1.23 or 123.' },
    { text: 't\tchannel\tconc\n0\tambient\t5\n1,5\tmask\t5', row: 3, column: 1, code: 'time-format', message: 'Row 3, column 1 (time): \'1,5\' is ambiguous: write 1.5 or 15.' },
    { text: 't,channel,conc\n0,outside,5', row: 2, column: 2, code: 'unknown-channel', message: 'Row 2, column 2: channel \'outside\' should be ambient or mask' },
    { text: 't,channel,conc\n5,mask,5\n4,mask,5', row: 3, column: 1, code: 'time-backwards', message: 'Row 3: time goes backwards (t = 4 s after 5 s on the mask channel); the reading was left out' },
    { text: 't,channel,conc\n0,mask,5\nsoon,mask,5', row: 3, column: 1, code: 'time-format', message: 'Row 3, column 1: time \'soon\' should be seconds from the start like the rows above' },
    { text: 't,channel,conc\n0,mask,5\n1,mask,5\n2,mask,5\n9,mask,5', row: 5, column: 1, code: 'gap', message: 'Row 5: no readings for 7 s (t = 2 s to 9 s); the counter may have paused' },
    { text: 'when,where,what\n0,mask,5', row: 1, column: 1, code: 'unknown-layout', message: 'Row 1: the header should name the columns t, channel, conc (or t, ambient, mask)' }
  ])('reports $code at row $row, column $column', ({ text, row, column, code, message }) => {
    const r = readCountSeries(text)
    expect(r.issues).toContainEqual(expect.objectContaining({ row, column, code, message }))
  })

  it('respects a gap option', () => {
    const text = 't,channel,conc\n0,mask,5\n1,mask,5\n2,mask,5\n9,mask,5'
    expect(readCountSeries(text, { maxGapSeconds: 10 }).issues).toEqual([])
  })

  it('reports an empty series once', () => {
    const r = parseCountSeries('  \n\n', STANDARD_PROTOCOL)
    expect(r.issues).toHaveLength(1)
    expect(r.issues[0]!.code).toBe('empty-series')
  })

  it('prefers the tab, then the semicolon, then the comma', () => {
    expect(detectDelimiter('0;1,5;2\n1;2,5;3')).toBe(';')
    expect(detectDelimiter('0\t1,5\n1\t2,5')).toBe('\t')
    expect(detectDelimiter('0,1\n1,2')).toBe(',')
  })
})

describe('segmenting by the protocol', () => {
  it('gives per-exercise ambient and in-mask means that feed computeFitTest', () => {
    const r = parseCountSeries(seriesFor(STANDARD_PROTOCOL, 2000, 4), STANDARD_PROTOCOL)
    expect(r.issues).toEqual([])
    const talking = r.segments.find(s => s.exerciseKey === 'talking')!
    expect(talking.ambientBefore?.mean).toBe(2000)
    expect(talking.inMask).toMatchObject({ mean: 4, readings: 46 })
    const inputs = segmentsToFitTestInputs(r.segments, STANDARD_PROTOCOL)
    const result = computeFitTest({ protocol: STANDARD_PROTOCOL, passLevel: 100, ...inputs })
    expect(result.ok && result.overall.value).toBeCloseTo(500, 9)
  })

  it('handles a modified protocol with ambient only at the start and end', () => {
    const r = parseCountSeries(seriesFor(MODIFIED_ELASTOMERIC_PROTOCOL, 3000, 6), MODIFIED_ELASTOMERIC_PROTOCOL)
    expect(r.issues).toEqual([])
    const inputs = segmentsToFitTestInputs(r.segments, MODIFIED_ELASTOMERIC_PROTOCOL)
    expect(inputs.wholeTestAmbient).toEqual({ start: 3000, end: 3000 })
    const result = computeFitTest({ protocol: MODIFIED_ELASTOMERIC_PROTOCOL, passLevel: 500, ...inputs })
    expect(result.ok && result.pass).toBe(true)
  })

  it('reports readings outside the protocol once per run, with their rows', () => {
    const text = `${seriesFor(MODIFIED_ELASTOMERIC_PROTOCOL)}\n149,mask,4\n150,mask,4\n151,mask,4`
    const r = parseCountSeries(text, MODIFIED_ELASTOMERIC_PROTOCOL)
    expect(r.issues).toEqual([expect.objectContaining({
      code: 'outside-protocol',
      row: 151,
      message: 'Rows 151–153 (t = 149–151 s, 3 readings) fall outside the 149 s of the Modified protocol, elastomeric half and full facepiece and were not used'
    })])
  })

  it('names an exercise with no in-mask readings', () => {
    const text = seriesFor(STANDARD_PROTOCOL).split('\n').filter((line) => {
      const t = Number(line.split(',')[0])
      return !(t >= 254 && t < 300)
    }).join('\n')
    const r = parseCountSeries(text, STANDARD_PROTOCOL)
    expect(r.issues).toContainEqual(expect.objectContaining({
      code: 'no-in-mask-readings',
      exerciseName: 'Talking',
      message: 'No in-mask readings for \'Talking\' (t = 254–300 s)'
    }))
    expect(r.issues).toContainEqual(expect.objectContaining({ code: 'gap' }))
  })

  it('shifts the timeline by an offset', () => {
    const shifted = seriesFor(STANDARD_PROTOCOL).split('\n').map((line, i) => {
      if (i === 0) return line
      const [t, ch, c] = line.split(',')
      return `${Number(t) + 30},${ch},${c}`
    }).join('\n')
    expect(parseCountSeries(shifted, STANDARD_PROTOCOL, { offsetSeconds: 30 }).issues).toEqual([])
    expect(parseCountSeries(shifted, STANDARD_PROTOCOL).issues.length).toBeGreaterThan(0)
  })

  it('flags readings on the wrong channel for the phase', () => {
    const text = seriesFor(STANDARD_PROTOCOL).replace('\n20,mask,4', '\n20,ambient,4')
    const r = parseCountSeries(text, STANDARD_PROTOCOL)
    expect(r.issues).toContainEqual(expect.objectContaining({ code: 'channel-phase-mismatch', row: 22 }))
  })

  it('reads a 10 Hz series the same way', () => {
    const r = parseCountSeries(seriesFor(STANDARD_PROTOCOL, 2000, 4, 10), STANDARD_PROTOCOL)
    expect(r.issues).toEqual([])
    expect(r.samplePeriodSeconds).toBeCloseTo(0.1, 9)
    expect(r.segments[0]!.inMask?.readings).toBe(460)
  })
})

describe('continuous ambient', () => {
  it('averages the ambient readings taken during each in-mask sample', () => {
    const parsed = protocolSchema.parse({
      key: 'dual-line',
      name: 'Dual-line demo protocol',
      ambientPlan: 'continuous',
      exercises: [
        { key: 'breathing', name: 'Breathing', durationSeconds: 30, counted: true, sampling: { ambientSeconds: 0, purgeSeconds: 0, maskSeconds: 30 } },
        { key: 'talking', name: 'Talking', durationSeconds: 30, counted: true, sampling: { ambientSeconds: 0, purgeSeconds: 0, maskSeconds: 30 } }
      ]
    })
    const lines = ['t\tambient\tmask']
    for (let t = 0; t < 60; t++) lines.push(`${t}\t${t < 30 ? 1000 : 3000}\t${t < 30 ? 2 : 30}`)
    const r = parseCountSeries(lines.join('\n'), parsed)
    expect(r.issues).toEqual([])
    expect(r.segments.map(s => s.ambientMean?.mean)).toEqual([1000, 3000])
    const result = computeFitTest({ protocol: parsed, passLevel: 100, ...segmentsToFitTestInputs(r.segments, parsed) })
    expect(result.ok && result.exercises.map(e => e.fitFactor?.value)).toEqual([500, 100])
  })
})

describe('numbers in a count series follow the organization\'s decimal mark', () => {
  // The rules of DOMAIN.md "Typing numbers" (common practice (no published source)); the values are derived by reading the text.
  it.each([
    { mark: 'point' as const, text: 't\tchannel\tconc\n0\tambient\t12,500\n1\tmask\t1,234', values: [12500, 1234], source: 'point: a comma groups thousands' },
    { mark: 'point' as const, text: 't,channel,conc\n0,ambient,"12,500"\n1,mask,1.2E+03', values: [12500, 1200], source: 'quoted grouped thousands and scientific notation' },
    { mark: 'comma' as const, text: 't;channel;conc\n0;ambient;12.500\n1;mask;1.234,5', values: [12500, 1234.5], source: 'comma: a point groups thousands' },
    { mark: 'comma' as const, text: 't\tchannel\tconc\n0\tambient\t8123,4\n1,5\tmask\t0,75', values: [8123.4, 0.75], source: 'comma: decimal commas in times and concentrations' },
    { mark: 'point' as const, text: 't,channel,conc\n0,ambient,12 500\n1,mask,−0', values: [12500, 0], source: 'spaces group digits; a Unicode minus zero is zero' }
  ])('$source', ({ mark, text, values }) => {
    const r = readCountSeries(text, { decimalMark: mark })
    expect(r.issues.filter(i => i.severity === 'error')).toEqual([])
    expect(r.readings.map(x => x.concentration)).toEqual(values)
  })

  it('reads "1.234" as 1.234 with a point and as 1234 with a comma, never by guessing from the delimiter', () => {
    // Derived: the same text, two marks (DOMAIN.md "Typing numbers").
    const text = 't;channel;conc\n0;mask;1.234'
    expect(readCountSeries(text, { decimalMark: 'point' }).readings[0]!.concentration).toBe(1.234)
    expect(readCountSeries(text, { decimalMark: 'comma' }).readings[0]!.concentration).toBe(1234)
  })

  it('gives the same value on the fast path as the one reader does', () => {
    // Derived: every cell a counter writes must read exactly as a typed cell reads.
    const random = mulberry32(8)
    for (let i = 0; i < 300; i++) {
      const value = Number((random() * 10 ** Math.floor(random() * 7)).toFixed(Math.floor(random() * 5)))
      for (const mark of ['point', 'comma'] as const) {
        const cell = mark === 'comma' ? String(value).replace('.', ',') : String(value)
        const tab = readCountSeries(`t\tchannel\tconc\n0\tmask\t${cell}`, { decimalMark: mark })
        const reader = readTypedNumber(cell, { decimalMark: mark })
        expect(reader.ok && tab.readings[0]!.concentration === reader.value, `${cell} (${mark})`).toBe(true)
      }
    }
  })
})
