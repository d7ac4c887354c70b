title Logger input anti-alias stage, 50 kHz
# Unity-gain second-order low-pass: Cg to ground at the follower's input, Cf back to the output.

Vin: vsource in  gnd 1
R1:  resistor  in  a   1.87k tol=1%
R2:  resistor  a   b   4.42k tol=1%
Cf:  capacitor a   out 1.5n  tol=5%
Cg:  capacitor b   gnd 820p  tol=5%
U1:  opamp     b   out out

sweep 1kHz to 1MHz log 100 per decade
show H = volts(out) / volts(in)
measure corner = crossing(H, -3dB)
measure at_f0  = mag(H) at 49.9155kHz
check corner between 40kHz and 60kHz
poles
