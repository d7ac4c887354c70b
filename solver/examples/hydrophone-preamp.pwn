title Hydrophone preamplifier, 40 dB, noise over the survey band
# Invented scenario: a piezo hydrophone (modelled as 4.7 nF in series with its source) feeds a
# non-inverting stage of gain 101 through a 10 kΩ bias/protection resistor. The op-amp's datasheet-style
# figures (en, in, 1/f corner, second pole) are made up for the example. With the 1 MΩ bias resistor
# the op-amp's current noise, not its voltage noise, dominates: see the noise view's shares.

temperature 12C

Vh:   vsource   hyd  gnd 1
Ch:   capacitor hyd  x   4.7n
Rb:   resistor  x    gnd 1M
Rin:  resistor  x    pos 10k
U1:   opamp     pos  neg out gbw=10M pole2=40M en=4n in=0.5p fc=20
Rf:   resistor  out  neg 100k
Rg:   resistor  neg  gnd 1k
Rl:   resistor  out  gnd 10k

sweep 1Hz to 1MHz log 50 per decade
show gain = volts(out) / volts(hyd)
noise N = volts(out) input Vh
zeros volts(out)
poles

measure g1k     = db(gain) at 1kHz
measure delay1k = group-delay(gain) at 1kHz
measure n1k     = noise(N) at 1kHz
measure survey  = noise(N) from 10Hz to 20kHz
measure inband  = input-noise(N) from 10Hz to 20kHz
check g1k between 39dB and 41dB
check survey < 600uV
