title Cable driver with capacitive load, gain 10
# Non-inverting amplifier with a finite gain-bandwidth op-amp; an isolation resistor and the
# cable's capacitance add a second pole inside the loop. The loop is cut at the op-amp's own
# output, which is an ideal voltage output, so the cut is exact.

Vin: vsource  in   gnd 1
U1:  opamp    in   neg amp  gain=100k gbw=1M
Ro:  resistor amp  out 100
Cl:  capacitor out gnd 22n
Rf:  resistor out  neg 9k
Rg:  resistor neg  gnd 1k

sweep 100Hz to 10MHz log 100 per decade
show  A = volts(out) / volts(in)
loop  T cut amp before Ro
measure crossover = unity(T)
measure pm        = phase-margin(T)
measure gm        = gain-margin(T)
measure closed    = crossing(A, -3dB)
check pm > 45deg
vary Cl over 4.7n, 10n, 22n, 47n
