#!/usr/bin/python3
"""Writes the corpus of bad design files and expect.tsv (file, exit code,
line, message fragment). Run from the repository root:

    /usr/bin/python3 testdata/bad/gen_bad.py

The Go test cmd/internal/app TestBadDesignCorpus runs every file through
the real command and checks the exit code, the line and the message.
"""
import os
base = '''name = "corpus base"

[cylinder]
tilt = "0 deg"
head_diameter = "120 mm"
head_length = "72 mm"
barrel_diameter = "92 mm"
barrel_length = "108 mm"

[head]
style = "annular"
count = 8
pitch = "9 mm"
height = "40 mm"
root_thickness = "4 mm"
tip_thickness = "2 mm"
alloy = "A356-T6"
finish = "as-cast"

[barrel]
style = "annular"
count = 12
pitch = "9 mm"
height = "30 mm"
root_thickness = "3.5 mm"
tip_thickness = "1.8 mm"
alloy = "A356-T6"
finish = "painted"

[air]
speed = "90 km/h"
pressure_recovery = 0.5
ambient = "35 C"
altitude = "0 m"

[load]
mass = "230 kg"
cda = "0.45 m2"

[limits]
head = "220 C"
'''
L = base.split('\n')
def line_of(text, start=0):
    for i, l in enumerate(L):
        if i >= start and l.strip().startswith(text):
            return i + 1
    raise SystemExit('no line ' + text)
def barrel_line(text):
    return line_of(text, line_of('[barrel]') - 1)

cases = []  # (name, content, exit, line, fragment)
def repl(name, old, new, frag, line=None, exit=3, count=1, after=None, mark=None):
    src = base
    if after is not None:
        idx = src.index(after)
        head, tail = src[:idx], src[idx:]
        assert old in tail, old
        src = head + tail.replace(old, new, 1)
    else:
        assert old in src, old
        src = src.replace(old, new, count)
    if line is None:
        # the line where the new text starts, or where its marked part is
        pos = src.index(new) if after is None else src.index(new, src.index(after))
        if mark is not None:
            pos = src.index(mark, pos)
        line = src[:pos].count('\n') + 1
    cases.append((name, src, exit, line, frag))

# syntax
repl('syntax-unclosed-table', '[head]', '[head', 'the table header reads "[head"', line=10)
repl('syntax-table-non-ascii', '[air]', '[a\u00edr]', 'the table header reads "[a\u00edr]"', line=None)
repl('syntax-unterminated-string', 'name = "corpus base"', 'name = "corpus base', 'newlines', line=1)
repl('syntax-missing-equals', 'count = 8', 'count 8', 'expected', line=12)
repl('syntax-duplicate-key', 'count = 8', 'count = 8\ncount = 9', 'already been defined', line=13)
repl('syntax-duplicate-table', '[limits]', '[head]\n[limits]', 'already been defined', line=None)
repl('syntax-bad-number', 'count = 8', 'count = 08', 'leading zero', line=12)
# types
repl('type-count-float', 'count = 8', 'count = 8.5', 'takes a whole number', line=12)
repl('type-count-string', 'count = 8', 'count = "eight"', 'wrong type', line=12)
repl('type-style-number', 'style = "annular"', 'style = 1', 'takes a quoted name', line=11)
repl('type-pitch-bool', 'pitch = "9 mm"', 'pitch = true', 'want a number or a quoted length', line=13)
repl('type-name-table', 'name = "corpus base"', 'name = ["a", "b"]', 'wrong type', line=1)
repl('type-speed-array', 'speed = "90 km/h"', 'speed = [90]', 'speed', line=None)
# unknown keys
repl('unknown-key-typo-pitch', 'pitch = "9 mm"', 'pich = "9 mm"', 'did you mean "head.pitch"', line=13)
repl('unknown-key-typo-ambient', 'ambient = "35 C"', 'ambiant = "35 C"', 'did you mean "air.ambient"', line=None)
repl('unknown-key-wrong-table', 'mass = "230 kg"', 'mass = "230 kg"\nspeed2 = 1', 'unknown key', line=None, mark='speed2')
repl('unknown-table', '[limits]', '[limitz]', 'unknown key', line=None)
repl('unknown-key-top', 'name = "corpus base"', 'name = "corpus base"\nsegmnts = 40', 'did you mean "segments"', line=2)
repl('unknown-key-in-wrong-table', 'ambient = "35 C"', 'ambient = "35 C"\ncount = 3', 'did you mean', line=None, mark='count = 3')
# units
repl('unit-missing-bare-ambient', 'ambient = "35 C"', 'ambient = 35', 'a bare number is kelvin', line=None)
repl('unit-missing-string', 'pitch = "9 mm"', 'pitch = "9"', 'has no unit', line=13)
repl('unit-wrong-kind', 'pitch = "9 mm"', 'pitch = "9 kg"', 'not a length unit', line=13)
repl('unit-unknown', 'speed = "90 km/h"', 'speed = "90 furlongs/fortnight"', 'not a speed unit', line=None)
repl('unit-no-number', 'height = "40 mm"', 'height = "mm"', 'has no number', line=14)
repl('unit-temperature-as-length', 'ambient = "35 C"', 'ambient = "35 m"', 'not a temperature unit', line=None)
repl('unit-bare-tilt-degrees', 'tilt = "0 deg"', 'tilt = 90', 'a bare number is radians', line=4)
repl('unit-bare-speed', 'speed = "90 km/h"', 'speed = 90', 'a bare number would be 90 m/s (324 km/h)', line=None)
repl('unit-bare-pitch', 'pitch = "9 mm"', 'pitch = 9', 'did you mean "9 mm"', line=13)
# sizes
repl('size-negative-pitch', 'pitch = "9 mm"', 'pitch = "-9 mm"', 'outside the allowed range', line=13)
repl('size-zero-height', 'height = "40 mm"', 'height = "0 mm"', 'outside the allowed range', line=14)
repl('size-zero-count', 'count = 8', 'count = 0', 'allowed 1 to 400', line=12)
repl('size-negative-count', 'count = 8', 'count = -3', 'allowed 1 to 400', line=12)
repl('size-zero-thickness', 'root_thickness = "4 mm"', 'root_thickness = "0 mm"', 'outside the allowed range', line=15)
repl('size-negative-diameter', 'barrel_diameter = "92 mm"', 'barrel_diameter = "-92 mm"', 'outside the allowed range', line=7)
repl('size-huge-length', 'head_length = "72 mm"', 'head_length = "5 m"', 'outside the allowed range', line=6)
repl('size-negative-mass', 'mass = "230 kg"', 'mass = "-230 kg"', 'outside the allowed range', line=None)
repl('size-zero-cda', 'cda = "0.45 m2"', 'cda = "0 m2"', 'outside the allowed range', line=None)
# geometry
repl('geom-pitch-not-above-thickness', 'pitch = "9 mm"', 'pitch = "4 mm"', 'not larger than the root thickness', line=13)
repl('geom-pitch-equal-thickness', 'pitch = "9 mm"', 'pitch = "3.5 mm"', 'not larger than the root thickness', line=None, after='[barrel]')
repl('geom-tip-thicker', 'tip_thickness = "2 mm"', 'tip_thickness = "5 mm"', 'thicker than the root', line=16)
repl('geom-fins-do-not-fit', 'count = 8', 'count = 9', 'need', line=12)
repl('geom-longitudinal-do-not-fit', 'style = "annular"\ncount = 8', 'style = "longitudinal"\ncount = 80', 'circumference', line=12)
repl('geom-height-absurd', 'height = "40 mm"', 'height = "130 mm"', 'taller than the cylinder is wide', line=14)
repl('geom-barrel-too-short', 'barrel_length = "108 mm"', 'barrel_length = "50 mm"', 'need', line=22)
# materials and finishes
repl('alloy-unknown', 'alloy = "A356-T6"', 'alloy = "A365-T6"', 'did you mean "A356-T6"', line=17)
repl('alloy-unknown-far', 'alloy = "A356-T6"', 'alloy = "unobtainium"', 'not in the alloy catalogue', line=17)
repl('alloy-missing', 'alloy = "A356-T6"\n', '', 'name an alloy', line=10)
repl('alloy-custom-incomplete', 'alloy = "A356-T6"', 'alloy = "shop"', 'missing for the custom alloy', line=None)
cases[-1] = (cases[-1][0], cases[-1][1] + '\n[alloys.shop]\nconductivity = "140 W/mK"\n', 3, 0, 'missing for the custom alloy')
repl('alloy-custom-unphysical', 'alloy = "A356-T6"', 'alloy = "shop"', 'conductivity', line=None)
cases[-1] = (cases[-1][0], cases[-1][1] + '\n[alloys.shop]\nconductivity = "9000 W/mK"\ndensity = "2700 kg/m3"\nspecific_heat = "900 J/kgK"\n', 3, 0, 'conductivity = 9000')
repl('finish-unknown', 'finish = "as-cast"', 'finish = "chrome"', 'not a finish', line=18)
repl('style-unknown', 'style = "annular"', 'style = "spiral"', 'not a fin style', line=11)
repl('emissivity-above-one', 'finish = "as-cast"', 'emissivity = 1.5', 'outside the allowed range', line=18)
# temperatures and air
repl('ambient-above-head-limit', 'head = "220 C"', 'head = "70 C"\n', 'not above the ambient', line=None)
cases[-1] = (cases[-1][0], cases[-1][1].replace('ambient = "35 C"', 'ambient = "60 C"').replace('head = "70 C"', 'head = "60 C"'), 3, 0, 'not above the ambient')
repl('ambient-below-absolute-zero', 'ambient = "35 C"', 'ambient = "-300 C"', 'outside the allowed range', line=None)
repl('ambient-kelvin-negative', 'ambient = "35 C"', 'ambient = "-5 K"', 'outside the allowed range', line=None)
repl('ambient-fahrenheit-absurd', 'ambient = "35 C"', 'ambient = "-500 F"', 'outside the allowed range', line=None)
repl('limit-below-absolute-zero', 'head = "220 C"', 'head = "-280 C"', 'outside the allowed range', line=None)
repl('speed-beyond-road-vehicles', 'speed = "90 km/h"', 'speed = "1200 km/h"', 'outside the allowed range 0 to 400 km/h', line=None)
repl('speed-negative', 'speed = "90 km/h"', 'speed = "-10 km/h"', 'outside the allowed range', line=None)
repl('speed-mach', 'speed = "90 km/h"', 'speed = "700 mph"', 'outside the allowed range', line=None)
repl('recovery-zero', 'pressure_recovery = 0.5', 'pressure_recovery = 0', 'outside the allowed range', line=None)
repl('recovery-above-one', 'pressure_recovery = 0.5', 'pressure_recovery = "150 %"', 'outside the allowed range', line=None)
repl('altitude-and-pressure', 'altitude = "0 m"', 'altitude = "0 m"\npressure = "101 kPa"', 'not both', line=None, mark='pressure')
repl('altitude-space', 'altitude = "0 m"', 'altitude = "100 km"', 'outside the allowed range', line=None)
repl('pressure-vacuum', 'altitude = "0 m"', 'pressure = "0 kPa"', 'outside the allowed range', line=None)
# NaN and Inf
repl('nan-number', 'pressure_recovery = 0.5', 'pressure_recovery = nan', 'not a finite number', line=None)
repl('inf-number', 'pressure_recovery = 0.5', 'pressure_recovery = inf', 'not a finite number', line=None)
repl('nan-in-string', 'pitch = "9 mm"', 'pitch = "nan mm"', 'has no number', line=13)
repl('inf-in-string', 'height = "40 mm"', 'height = "inf mm"', 'has no number', line=14)
repl('overflow-in-string', 'height = "40 mm"', 'height = "1e400 mm"', 'not a number', line=14)
# load
repl('load-missing', '[load]\nmass = "230 kg"\ncda = "0.45 m2"\n', '', 'missing table [load]', line=0)
repl('load-both-ways', 'mass = "230 kg"', 'mass = "230 kg"\nhead_heat = "2 kW"\nbarrel_heat = "1 kW"', 'not used when head_heat', line=None)
repl('load-cda-missing', 'cda = "0.45 m2"\n', '', 'load.cda: missing', line=0)
repl('load-cylinders-zero', 'cda = "0.45 m2"', 'cda = "0.45 m2"\ncylinders = 0', 'allowed 1 to 16', line=None, mark='cylinders')
repl('load-efficiency-above-one', 'cda = "0.45 m2"', 'cda = "0.45 m2"\nthermal_efficiency = 1.2', 'outside the allowed range', line=None, mark='thermal')
repl('load-head-share-negative', 'cda = "0.45 m2"', 'cda = "0.45 m2"\nhead_share = -0.1', 'outside the allowed range', line=None, mark='head_share')
# missing things
repl('missing-head-table', '[head]', '[headfins]', 'unknown key', line=None)
repl('missing-speed', 'speed = "90 km/h"\n', '', 'air.speed: missing', line=0)
repl('missing-diameter', 'head_diameter = "120 mm"\n', '', 'cylinder.head_diameter: missing', line=0)
repl('segments-zero', 'name = "corpus base"', 'name = "corpus base"\nsegments = 0', 'allowed 1 to 10000', line=2)
repl('override-wall-below-ambient', '[limits]', '[override]\nhead_wall = "20 C"\nbarrel_wall = "150 C"\n\n[limits]', 'not above the ambient', line=None, mark='head_wall')

# cooling air ([cooling], [[fan_point]]) and the ride's masses ([ride])
repl('cooling-source-unknown', '[limits]', '[cooling]\nsource = "blower"\n\n[limits]', 'use ram (the default), duct or fan', mark='source')
repl('cooling-duct-both', '[limits]', '[cooling]\nsource = "duct"\ndrop = "1 kPa"\nmass_flow = "0.1 kg/s"\n\n[limits]', 'one of them', line=0)
repl('cooling-duct-drop-range', '[limits]', '[cooling]\nsource = "duct"\ndrop = "90 kPa"\n\n[limits]', 'cooling.drop', mark='drop')
repl('cooling-key-unused', '[limits]', '[cooling]\nsource = "ram"\nleakage = 0.1\n\n[limits]', 'not used with source = "ram"', mark='leakage')
repl('cooling-route-series-annular', '[limits]', '[cooling]\nsource = "duct"\ndrop = "1 kPa"\nroute = "series"\n\n[limits]', 'needs longitudinal fins', mark='route')
repl('fan-curve-missing', '[limits]', '[cooling]\nsource = "fan"\nfan_curve_speed = "6000 rpm"\nengine_speed = "5000 rpm"\n\n[limits]', 'two or more [[fan_point]] tables', line=0)
repl('fan-point-pressure-rising', 'name = "corpus base"', 'name = "corpus base"\n\n[cooling]\nsource = "fan"\nfan_curve_speed = "6000 rpm"\nengine_speed = "5000 rpm"\n\n[[fan_point]]\nflow = "0 m3/s"\npressure = "500 Pa"\n\n[[fan_point]]\nflow = "0.05 m3/s"\npressure = "700 Pa"', 'rises above the point before', mark='pressure = "700')
repl('ride-metal-range', '[limits]', '[ride]\nhead_metal = "300 kg"\n\n[limits]', 'ride.head_metal', mark='head_metal')
fan_head = '[cooling]\nsource = "fan"\nfan_curve_speed = "6000 rpm"\nengine_speed = "5000 rpm"\n\n'
repl('fan-efficiency-partial', '[limits]', fan_head + '[[fan_point]]\nflow = "0 m3/s"\npressure = "500 Pa"\nefficiency = 0.3\n\n[[fan_point]]\nflow = "0.1 m3/s"\npressure = "0 Pa"\n\n[limits]', 'fan_point[2].efficiency: missing: the curve gives the efficiency at point 1 only', mark='[[fan_point]]\nflow = "0.1')
repl('fan-rated-below-idle', 'cda = "0.45 m2"', 'cda = "0.45 m2"\ntop_gear_speed = "110 km/h"\n\n[cooling]\nsource = "fan"\nfan_curve_speed = "6000 rpm"\nidle_speed = "4000 rpm"\nrated_speed = "2000 rpm"\n\n[[fan_point]]\nflow = "0 m3/s"\npressure = "500 Pa"\n\n[[fan_point]]\nflow = "0.1 m3/s"\npressure = "0 Pa"', 'is not above idle_speed', mark='rated_speed')
# readings ([[measurement]]): every key used as given or refused; none is a "not set" mark
meas = '[[measurement]]\nspeed = "90 km/h"\nambient = "28 C"\nhead = "204 C"\n'
def measurement(name, old, new, frag, mark=None):
    m = meas.replace(old, new) if old else meas + new
    repl(name, '[limits]', m + '\n[limits]', frag, mark=mark or new.split('=')[0].strip() or '[[measurement]]')
measurement('measurement-uncertainty-zero', None, 'uncertainty = "0 K"\n', 'measurement[1].uncertainty: 0 K is outside the allowed 0.1 to 50 K')
measurement('measurement-speed-missing', 'speed = "90 km/h"\n', '', 'measurement[1].speed: missing', mark='[[measurement]]')
measurement('measurement-head-and-barrel', None, 'barrel = "150 C"\n', 'measurement[1].head: a reading is of the head or of the barrel, not both', mark='head =')
measurement('measurement-plug-seat-no-offset', None, 'place = "plug-seat"\n', 'measurement[1].offset: missing: a plug-seat reading needs offset', mark='[[measurement]]')
measurement('measurement-offset-uncertainty-negative', None, 'place = "plug-seat"\noffset = "15 K"\noffset_uncertainty = "-2 K"\n', 'measurement[1].offset_uncertainty: -2 K is outside the allowed 0 to 50 K', mark='offset_uncertainty')
measurement('measurement-bare-speed', 'speed = "90 km/h"', 'speed = 90', 'measurement[1].speed: 90 has no unit', mark='speed = 90')
measurement('measurement-below-ambient', 'head = "204 C"', 'head = "20 C"', 'measurement[1].head: 20 C: the measured temperature must lie between the ambient (28 C) and 500 C', mark='head =')

out = []
for name, src, code, line, frag in cases:
    fn = name + '.toml'
    with open(os.path.join('testdata/bad', fn), 'w') as f:
        f.write(src)
    out.append(f'{fn}\t{code}\t{line}\t{frag}')
# empty, whitespace, binary
open('testdata/bad/empty.toml', 'w').write('')
out.append('empty.toml\t3\t0\tfile is empty')
open('testdata/bad/only-comments.toml', 'w').write('# nothing here\n\n')
out.append('only-comments.toml\t3\t0\tmissing')
open('testdata/bad/binary-garbage.toml', 'wb').write(bytes(range(256)) * 4)
out.append('binary-garbage.toml\t3\t0\tnot text')
open('testdata/bad/utf16.toml', 'wb').write(base.encode('utf-16'))
out.append('utf16.toml\t3\t0\tnot text')

# The readers of the other input files: ride files (finmarch ride DESIGN
# --profile FILE) and points files (finmarch calibrate DESIGN --points
# FILE), run on the upright demo by cmd/internal/app TestReaderCorpus; an
# exit code of 0 names a fragment of the standard output.
readers = []  # (command, file, content, exit, line, fragment)
def reader(cmd, name, content, code, line, frag):
    readers.append((cmd, name, content, code, line, frag))
ride_head = 'time (s),speed (km/h),grade (%)\n'
reader('ride', 'ride-speed-missing-cell.csv', ride_head + '0,50,0\n60\n120,0,0\n', 3, 3, 'speed: empty; every row but the last needs its road speed, 0 to 400 km/h')
reader('ride', 'ride-speed-empty-cell.csv', ride_head + '0,50,0\n60,,0\n120,0,0\n', 3, 3, 'speed: empty')
reader('ride', 'ride-grade-empty-cell.csv', ride_head + '0,50,0\n60,40,\n120,0,0\n', 3, 3, 'grade: empty; every row but the last needs its grade, -30 to 30 %')
reader('ride', 'ride-time-empty-cell.csv', ride_head + '0,50,0\n,40,0\n120,0,0\n', 3, 3, 'time: empty; every row needs its time')
reader('ride', 'ride-barrel-heat-empty-cell.csv', 'time (s),speed (km/h),head_heat (W),barrel_heat (W)\n0,50,800,400\n60,40,800,\n120,0,300,200\n', 3, 3, 'barrel_heat: empty; every row but the last needs the heat to the barrel fins, 0 to 5e+04 W')
reader('ride', 'ride-heat-one-column.csv', 'time (s),speed (km/h),head_heat (W)\n0,50,800\n60,0,300\n', 3, 1, 'give head_heat and barrel_heat together')
reader('ride', 'ride-extra-cell.csv', ride_head + '0,50,0,7\n60,0,0\n', 3, 2, 'column 4: 4 cells, but the header names 3 columns')
reader('ride', 'ride-unknown-column.csv', 'time (s),speed (km/h),gear\n0,50,3\n60,0,1\n', 3, 1, 'gear: unknown column')
reader('ride', 'ride-bare-time.csv', 'time,speed (km/h)\n0,50\n60,0\n', 3, 2, 'time: "0" has no unit')
reader('ride', 'ride-speed-range.csv', ride_head + '0,500,0\n60,0,0\n', 3, 2, 'speed: 500 is outside the allowed 0 to 400 km/h')
reader('ride', 'ride-time-backwards.csv', ride_head + '0,50,0\n60,40,0\n30,0,0\n', 3, 4, 'time: 30 s is not after the row before (60 s, line 3)')
reader('ride', 'ride-time-not-zero.csv', ride_head + '5,50,0\n60,0,0\n', 3, 2, 'time: the ride starts at 0, not 5 s')
reader('ride', 'ride-one-row.csv', ride_head + '0,50,0\n', 3, 0, 'a ride needs at least two rows')
reader('ride', 'ride-quote.csv', ride_head + '0,5"0,0\n60,0,0\n', 3, 2, 'speed: bare " in non-quoted-field')
reader('ride', 'ride-nul.csv', ride_head + '0,50,0\n60,0\x00,0\n', 3, 3, 'speed: a NUL byte')
reader('ride', 'ride-latin1.csv', 'time (s),speed (km/h),ambient\n0,50,30\xb0C\n60,0,\n', 3, 2, 'ambient: byte 0xB0: not text in UTF-8')
reader('ride', 'ride-nan.csv', ride_head + '0,NaN,0\n60,0,0\n', 3, 2, 'speed:')
reader('ride', 'ride-byte-order-mark.csv', '\ufeff' + ride_head + '0,50,0\n10 min,0,0\n', 0, 0, '2 rows over 10.0 min')
reader('ride', 'ride-last-row-time-only.csv', 'time (s),speed (km/h),ambient (C),head_heat (W),barrel_heat (W)\n0,50,,800,400\n600\n', 0, 0, '2 rows over 10.0 min')
pt_head = 'speed (km/h),ambient (C),head (C),place,offset (K),uncertainty (K)\n'
reader('calibrate', 'points-speed-empty-cell.csv', pt_head + ',28,204,plug-seat,15,5\n', 3, 2, 'speed: empty; every reading needs its road speed, 0 to 400 km/h')
reader('calibrate', 'points-ambient-missing-cell.csv', 'speed (km/h),ambient (C),head (C)\n90\n', 3, 2, 'ambient: empty; every reading needs its ambient, -50 to 60 C')
reader('calibrate', 'points-head-missing-cell.csv', 'speed (km/h),ambient (C),head (C)\n90,28\n', 3, 2, 'head: empty; every reading needs its measured head temperature')
reader('calibrate', 'points-uncertainty-zero.csv', pt_head + '90,28,204,plug-seat,15,0\n', 3, 2, 'uncertainty: 0 K is outside the allowed 0.1 to 50 K (leave it out for 5 K)')
reader('calibrate', 'points-offset-range.csv', pt_head + '90,28,204,plug-seat,300,5\n', 3, 2, 'offset: 300 K is outside the allowed range')
reader('calibrate', 'points-head-and-barrel.csv', 'speed (km/h),ambient (C),head (C),barrel (C)\n90,28,204,150\n', 3, 2, 'head: a reading is of the head or of the barrel, not both')
reader('calibrate', 'points-below-ambient.csv', pt_head + '90,28,20,plug-seat,15,5\n', 3, 2, 'head: 20 C: the measured temperature must lie between the ambient (28 C) and 500 C')
reader('calibrate', 'points-no-unit.csv', 'speed,ambient (C),head (C)\n90,28,204\n', 3, 2, 'speed: "90" has no unit')
reader('calibrate', 'points-unknown-column.csv', 'speed (km/h),ambient (C),temp (C)\n90,28,204\n', 3, 1, 'temp (C): unknown column')
reader('calibrate', 'points-quote.csv', pt_head + '90,"28" C,204,plug-seat,15,5\n', 3, 2, 'ambient: extraneous or missing " in quoted-field')
reader('calibrate', 'points-place-unknown.csv', pt_head + '90,28,204,exhaust,15,5\n', 3, 2, 'place: "exhaust": fin-root (the default) or plug-seat')
reader('calibrate', 'points-too-many-rows.csv', pt_head + '90,28,204,plug-seat,15,5\n' * 201, 3, 202, 'more than 200 rows; a points file holds at most 200')
reader('calibrate', 'points-byte-order-mark.csv', '\ufeff' + pt_head + '90,28,204,plug-seat,15,5\n', 0, 0, 'Fitted parameters')
for cmd, name, content, code, line, frag in readers:
    with open(os.path.join('testdata/bad', name), 'wb') as f:
        f.write(content.encode('utf-8').replace(b'\xc2\xb0', b'\xb0'))
with open('testdata/bad/readers.tsv', 'w') as f:
    f.write('# command\tfile\texit code\tline (0: no line check)\tmessage fragment (of stderr; of stdout when the exit code is 0)\n')
    f.write(''.join(f'{c}\t{n}\t{code}\t{line}\t{frag}\n' for c, n, _, code, line, frag in readers))

with open('testdata/bad/expect.tsv', 'w') as f:
    f.write('# file\texit code\tline (0: no line check)\tmessage fragment\n')
    f.write('\n'.join(out) + '\n')
print(len(out), 'design cases,', len(readers), 'reader cases')
