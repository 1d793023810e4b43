import { describe, expect, it } from 'vitest'
import { readCsv } from '../../../server/services/csv/read-csv'
import { bool, dayTypes, num, optional, text, timeOfDay } from '../../../server/services/csv/columns'

const columns = [
  text({ name: 'name', description: '', example: '' }),
  num({ name: 'cycle_s', min: 0, exclusiveMin: true, max: 300, description: '', example: '' }),
  timeOfDay({ name: 'start_time', description: '', example: '' }),
  dayTypes({ name: 'day_types', description: '', example: '' }),
  optional(bool({ name: 'ped_concurrent', description: '', example: '' })),
]

describe('readCsv', () => {
  it('reads typed values, trims cells, skips blank lines and strips a byte-order mark', () => {
    const { records, errors } = readCsv('\uFEFFname,cycle_s,start_time,day_types\n A & B , 90 ,7:00,weekday;saturday\n\nC,100,24:00,sunday\n', columns)
    expect(errors).toEqual([])
    expect(records.map((r) => [r.line, r.values])).toEqual([
      [2, { name: 'A & B', cycle_s: 90, start_time: '07:00', day_types: ['weekday', 'saturday'] }],
      [4, { name: 'C', cycle_s: 100, start_time: '24:00', day_types: ['sunday'] }],
    ])
  })

  it('reports every bad cell with its line, column and value', () => {
    const { errors } = readCsv('name,cycle_s,start_time,day_types,ped_concurrent\nA,0,07:00,weekday,maybe\nB,abc,25:00,holiday,\n', columns)
    expect(errors.map((e) => [e.line, e.column, e.value])).toEqual([
      [2, 'cycle_s', '0'], [2, 'ped_concurrent', 'maybe'],
      [3, 'cycle_s', 'abc'], [3, 'start_time', '25:00'], [3, 'day_types', 'holiday'],
    ])
    expect(errors[0].message).toContain('above 0')
  })

  it('counts lines inside quoted cells', () => {
    const { errors } = readCsv('name,cycle_s,start_time,day_types\n"two\nlines",90,07:00,weekday\nX,-1,07:00,weekday\n', columns)
    expect(errors).toMatchObject([{ line: 4, column: 'cycle_s' }])
  })

  it('reports unknown and missing columns on line 1 and empty required cells', () => {
    const { errors } = readCsv('name,cycle_s,colour\nA,,red\n', columns)
    expect(errors.map((e) => [e.line, e.column])).toEqual([[1, 'colour'], [1, 'start_time'], [1, 'day_types'], [2, 'cycle_s']])
  })

  it('refuses an empty file and a header without data', () => {
    expect(readCsv('', columns).errors[0].message).toContain('empty')
    expect(readCsv('name,cycle_s,start_time,day_types\n', columns).errors[0]).toMatchObject({ line: 2 })
  })
})
