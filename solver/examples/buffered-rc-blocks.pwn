title Sensor front end, two buffered RC sections
# The same first-order section is used twice through a block; each section ends in a buffer
# built from a preset. Buffered sections don't load each other: -3.01 dB each at the corner.

preset buffer = opamp gbw=100M

block rc_section(in, out) r=10k c=10n
  R:   resistor  in  x   r   tol=1%
  C:   capacitor x   gnd c   tol=5%
  Buf: buffer    x   out out
end

Vin: vsource in gnd 1
S1:  rc_section in  mid
S2:  rc_section mid out r=(snap(E24, 9.6k))    # 9.6k snaps to 10k
Rl:  resistor   out gnd 10k

sweep 10Hz to 1MHz log 100 per decade
show H = volts(out) / volts(in)
show first = volts(S1.out) / volts(in)
measure corner = crossing(first, half-power)
measure both   = db(H) at corner
check both between -6.2dB and -5.8dB
