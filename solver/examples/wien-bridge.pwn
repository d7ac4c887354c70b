title Bench sweep source, 1.6 kHz
# A bridge oscillator: series RC into shunt RC feeds the non-inverting input; the amplifier's
# gain K = 1 + Rf/Rg must reach 3 for the loop gain to reach 1 where its phase is zero.

let R = 10k
let C = 10n                 # f0 = 1/(2*pi*R*C) = 1591.55 Hz

Rs: resistor  out  mid  R   tol=1%
Cs: capacitor mid  pos  C   tol=5%
Rp: resistor  pos  gnd  R   tol=1%
Cp: capacitor pos  gnd  C   tol=5%
U1: opamp     pos  neg  out
Rf: resistor  neg  out  20.5k tol=1%
Rg: resistor  neg  gnd  10k   tol=1%     # K = 3.05: starts reliably, grows slowly

sweep 100Hz to 20kHz log 200 per decade
show  network = volts(pos) / volts(out)
loop  T cut out before Rs
measure f0     = zero-phase(T)
measure margin = mag(T) at f0
measure beta   = mag(network) at f0
check margin >= 1
check f0 between 1.5kHz and 1.7kHz
poles
monte-carlo 200 seed=11
