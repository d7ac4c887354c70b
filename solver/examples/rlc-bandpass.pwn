title Tone detector input filter, 5 kHz
# Series RLC driven by a source; the output is read across R.

Vin: vsource   in  gnd 1
L1:  inductor  in  a   10m  tol=10%
C1:  capacitor a   out 100n tol=5%
R1:  resistor  out gnd 100

sweep 500Hz to 50kHz log 200 per decade
show H = volts(out) / volts(in)
show Zin = volts(in) / amps(Vin)
measure centre = peak(H)
measure width  = bandwidth(H)
measure quality = q(H)
check centre between 4.8kHz and 5.2kHz
check quality > 3
sensitivity centre
