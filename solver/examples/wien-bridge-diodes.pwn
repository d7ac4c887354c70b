title Bench sweep source, 1.6 kHz, diode-limited
# The bridge oscillator of wien-bridge.pwn with its gain set to K = 1 + (Rf1 + Rf2)/Rg = 3.2, so it
# starts without doubt, and two diodes across Rf2: above about half a volt across Rf2 they conduct,
# the gain falls towards 1 + Rf1/Rg = 2.5 and the amplitude settles where the loop gain is 1.

let R = 10k
let C = 10n                 # f0 = 1/(2*pi*R*C) = 1591.55 Hz

Rs:  resistor  out  mid  R   tol=1%
Cs:  capacitor mid  pos  C   tol=5%
Rp:  resistor  pos  gnd  R   tol=1%
Cp:  capacitor pos  gnd  C   tol=5%
U1:  opamp     pos  neg  out swing=13V
Rg:  resistor  neg  gnd  10k tol=1%
Rf1: resistor  neg  lim  15k tol=1%
Rf2: resistor  lim  out  7k  tol=1%
D1:  diode     lim  out
D2:  diode     out  lim

temperature 27C
sweep 100Hz to 20kHz log 200 per decade
show  network = volts(pos) / volts(out)
loop  T cut out before Rs
steady T harmonics=15
measure f0     = zero-phase(T)
measure margin = mag(T) at f0
measure fosc   = frequency(T)
measure swing  = amplitude(volts(out))
measure purity = thd(volts(out))
measure settle = startup(T)
check margin >= 1
check fosc between 1.5kHz and 1.7kHz
check purity < 5%
check settle < 50m
poles
