title Alarm-tone generator, 650 Hz
# Three high-pass RC sections shift the phase by 180° at 1/(2*pi*sqrt(6)*R*C);
# the inverting stage supplies the other 180° and a gain above 29.

let R = 10k
let C = 10n

C1: capacitor out n1  C
R1: resistor  n1  gnd R
C2: capacitor n1  n2  C
R2: resistor  n2  gnd R
C3: capacitor n2  n3  C
R3: resistor  n3  neg R          # the last shunt R ends on the virtual ground
U1: opamp     gnd neg out
Rf: resistor  neg out 300k       # inverting gain 30

sweep 100Hz to 10kHz log 200 per decade
loop T cut out before C1
measure fosc  = zero-phase(T)
measure loopg = mag(T) at fosc
check loopg >= 1
check fosc between 600Hz and 700Hz
