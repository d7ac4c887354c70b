title Line driver into a cable, op-amp output resistance
# A gain-of-10 non-inverting stage drives a cable directly from the op-amp's output pin. The
# op-amp's 50 ohm open-loop output resistance and the cable's capacitance add a pole inside the
# loop. The output pin is not an ideal voltage output, so a plain cut there would leave that pole
# out (phase margin about 90 deg); double injection keeps the loading and shows the real margin.

Vin: vsource   in   gnd 1
U1:  opamp     in   neg amp  gain=100k gbw=1M rout=50
Cl:  capacitor amp  gnd 47n              # cable, about 470 m of 100 pF/m
Rl:  resistor  amp  gnd 10k              # the receiving end
Rf:  resistor  amp  neg 9k
Rg:  resistor  neg  gnd 1k

sweep 100Hz to 10MHz log 100 per decade
show  A = volts(amp) / volts(in)
loop  T cut amp before Cl,Rl,Rf method=injection
measure crossover = unity(T)
measure pm        = phase-margin(T)
measure peaking   = peak(A)
measure peak_db   = db(A) at peaking
check pm > 40deg
