title Hum rejection notch for a lab preamp, 1.59 kHz
# Twin-T: R, R in series with 2C to ground; C, C in series with R/2 to ground. Null at 1/(2*pi*R*C).

let R = 10k
let C = 10n

Vin: vsource   in  gnd 1
Ra:  resistor  in  t1  R
Rb:  resistor  t1  out R
C0:  capacitor t1  gnd (2*C)
Ca:  capacitor in  t2  C
Cb:  capacitor t2  out C
R0:  resistor  t2  gnd (R/2)

sweep 10Hz to 100kHz log 200 per decade
show H = volts(out) / volts(in)
measure null  = dip(H)
measure depth = db(H) at null
measure lower = crossing(H, half-power)
check null between 1.55kHz and 1.65kHz
check depth < -40dB
