// Demo netlists of the invented Corvane Instruments scenario (a small maker of bench test equipment).

export const WIEN_REV_A = `title CV-200 reference oscillator, rev A (ideal amplifier)

let R = 10k
let C = 10n                       # f0 = 1/(2*pi*R*C), about 1.59 kHz

Rs: resistor  amp_out mid     R
Cs: capacitor mid     pos     C
Rp: resistor  pos     gnd     R   tol=1%
Cp: capacitor pos     gnd     C   tol=5%
U1: opamp     pos     neg     amp_out
Rf: resistor  neg     amp_out 20.5k
Rg: resistor  neg     gnd     10k  # K = 1 + Rf/Rg = 3.05

sweep 10Hz to 100kHz log 100 per decade
show  bridge = volts(pos) / volts(amp_out)
loop  T cut amp_out before Rs
measure f0   = zero-phase(bridge)
measure gain = mag(T) at f0
check gain >= 1
check f0 between 1.5kHz and 1.7kHz
`;

export const WIEN_REV_B = `title CV-200 reference oscillator, rev B (1 MHz amplifier)

let R = 10k
let C = 10n

Rs: resistor  amp_out mid     R
Cs: capacitor mid     pos     C
Rp: resistor  pos     gnd     R   tol=1%
Cp: capacitor pos     gnd     C   tol=5%
U1: opamp     pos     neg     amp_out gain=100k gbw=1MHz
Rf: resistor  neg     amp_out 20.5k
Rg: resistor  neg     gnd     10k

sweep 10Hz to 100kHz log 100 per decade
show  bridge = volts(pos) / volts(amp_out)
loop  T cut amp_out before Rs
measure f0   = zero-phase(bridge)
measure fosc = zero-phase(T)
measure gain = mag(T) at fosc
check gain >= 1
check fosc between 1.5kHz and 1.7kHz
`;

export const WIEN_1K = `title CV-200 service tone, 1 kHz variant

let R = 16k
let C = 10n                       # about 995 Hz

Rs: resistor  amp_out mid     R
Cs: capacitor mid     pos     C
Rp: resistor  pos     gnd     R   tol=1%
Cp: capacitor pos     gnd     C   tol=5%
U1: opamp     pos     neg     amp_out
Rf: resistor  neg     amp_out 24k
Rg: resistor  neg     gnd     11k

sweep 10Hz to 100kHz log 100 per decade
show  bridge = volts(pos) / volts(amp_out)
loop  T cut amp_out before Rs
measure f0   = zero-phase(bridge)
measure gain = mag(T) at f0
check gain >= 1
check f0 between 950Hz and 1.05kHz
`;

export const LOWPASS_STAGE2 = `title CV-300 anti-alias stage 2, unity-gain low-pass

Vin: vsource   in  gnd 1
R1:  resistor  in  a   1.87k tol=1%
R2:  resistor  a   b   4.42k tol=1%
Cf:  capacitor a   out 1.5n  tol=5%
Cg:  capacitor b   gnd 820p  tol=5%
U1:  opamp     b   out out

sweep 100Hz to 10MHz log 50 per decade
show  H = volts(out) / volts(in)
measure fc      = crossing(H, -3dB)
measure gain_lf = db(H) at 100Hz
check fc between 40kHz and 60kHz
check gain_lf > -0.1
`;

export const PILOT_NOTCH = `title CV-300 pilot-tone notch, passive twin-T

Vin: vsource   in  gnd 1
Ra:  resistor  in  t1  10k
Rb:  resistor  t1  out 10k
Cm:  capacitor t1  gnd 20n
Ca:  capacitor in  t2  10n
Cb:  capacitor t2  out 10n
Rm:  resistor  t2  gnd 5k

sweep 100Hz to 20kHz log 100 per decade
show  N = volts(out) / volts(in)
measure fnotch = dip(N)
measure edge   = crossing(N, -3dB)
check fnotch between 1.5kHz and 1.7kHz
`;

export const LINE_DRIVER = `title CV-300 output driver into the rack cable

# The stage drives about 470 m of 100 pF/m cable straight from the op-amp's pin. Its 50 ohm
# open-loop output resistance and the cable make a pole inside the loop: the loop gain is measured
# by double injection so that the driver's loading is kept.
Vin: vsource   in   gnd 1
U1:  opamp     in   neg amp  gain=100k gbw=1M rout=50
Cl:  capacitor amp  gnd 47n
Rl:  resistor  amp  gnd 10k
Rf:  resistor  amp  neg 9k
Rg:  resistor  neg  gnd 1k

sweep 100Hz to 10MHz log 100 per decade
show  A = volts(amp) / volts(in)
loop  T cut amp before Cl,Rl,Rf method=injection
measure crossover = unity(T)
measure pm        = phase-margin(T)
measure peaking   = peak(A)
check pm > 45deg
`;

export const WIEN_REV_C = `title CV-200 reference oscillator, rev C (diode amplitude control)

let R = 10k
let C = 10n                       # f0 about 1.59 kHz

Rs:  resistor  amp_out mid     R   tol=1%
Cs:  capacitor mid     pos     C   tol=5%
Rp:  resistor  pos     gnd     R   tol=1%
Cp:  capacitor pos     gnd     C   tol=5%
U1:  opamp     pos     neg     amp_out gain=100k gbw=1MHz swing=13V
Rg:  resistor  neg     gnd     10k tol=1%
Rf1: resistor  neg     lim     15k tol=1%
Rf2: resistor  lim     amp_out 7.5k tol=1%   # K = 3.25 small-signal, about 2.5 once D1/D2 conduct
D1:  diode     lim     amp_out
D2:  diode     amp_out lim

temperature 27C
sweep 10Hz to 100kHz log 100 per decade
show  bridge = volts(pos) / volts(amp_out)
loop  T cut amp_out before Rs
steady T harmonics=15
measure fosc   = frequency(T)
measure level  = amplitude(volts(amp_out))
measure purity = thd(volts(amp_out))
measure settle = startup(T)
check fosc between 1.5kHz and 1.7kHz
check level between 3V and 6V
check purity < 5%
check settle < 50m
poles
monte-carlo 60 seed=23
`;
