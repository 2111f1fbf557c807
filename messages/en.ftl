# ampreport's message catalogue: English, the reference.
#
# Every fixed sentence and label the program shows a reader comes from a
# catalogue like this one (Project Fluent syntax: `key = text`; an argument
# is written { $name }; a continuation line is indented). A translation
# gives every key of this file and nothing else; see DEVELOPERS.md, "How to
# add a message or a language", and docs/shop.md for a shop's own file.
#
# Dates: `date` puts the day, the month's name and the year in order.

date = { $day } { $month } { $year }
month-1 = January
month-2 = February
month-3 = March
month-4 = April
month-5 = May
month-6 = June
month-7 = July
month-8 = August
month-9 = September
month-10 = October
month-11 = November
month-12 = December

## Status words, shown in the document's tables and panels.

## The hand-over document (templates/handover.typ).

doc-footer-job = Job
doc-footer-page = Page
doc-footer-of = of
doc-footer-commit = commit
doc-footer-edits = + edits
doc-photos = Photos
doc-footer-digest = job file SHA-256
status-ok = OK
status-caution = CAUTION
status-over = OVER
status-cold = COLD
status-accepted = ACCEPTED
status-unchecked = NOT CHECKED
status-unmeasured = NOT MEASURED
doc-key-ok = inside its limit
doc-key-caution = near a limit
doc-key-over = beyond a rating
doc-key-cold = below the bias aim
doc-key-accepted = judged acceptable
doc-kind = HAND-OVER REPORT
doc-job = Job { $id }
doc-received = Received { $date }
doc-completed = Completed { $date }
doc-technician = Technician: { $name }
doc-unit = Unit
doc-serial = Serial
doc-made = Made { $year }
doc-condition = Condition on arrival:
doc-customer = Customer
doc-not-recorded = Not recorded
doc-mains = Mains
doc-mains-line = { $nominal } nominal, high line { $high_line } ({ $tolerance })
doc-mains-design = ; the factory voltage chart was drawn at { $design }
doc-found = Found
doc-done = Done
doc-now = Now
doc-glance = AT A GLANCE
doc-read-notice-bold = Before using or opening this unit,
doc-read-notice = read the mains-safety notice on page
doc-read-notice-end = .
doc-attention = What needs attention
doc-open-in = Open in the readings “{ $label }”, as the unit leaves
doc-nothing-open = Nothing is open in the readings “{ $label }”, as the unit leaves.
doc-accepted-heading = Accepted by the technician
doc-col-finding = Finding
doc-col-figure = Figure
doc-col-why-acceptable = Why it is acceptable
doc-col-accepted-by = Accepted by
doc-accepted-note = An accepted figure keeps its status and its numbers in the tables; the technician has judged it and signed for it, so it no longer counts against the unit.
doc-whole-job = For the whole job
doc-history = What the readings “{ $label }” showed
doc-the-job = The job
doc-complaint = Complaint
doc-findings = Findings
doc-work-done = Work done
doc-parts = Parts replaced
doc-col-part = Part
doc-col-was = Was
doc-col-now = Now
doc-col-reason = Reason
doc-col-original-kept = Original
    kept
doc-no-parts = No parts were replaced.
doc-mods = Modifications
doc-col-change = Change
doc-col-why = Why
doc-col-reversible = Reversible
doc-worked-figures = Worked figures
doc-worked-note = Worked figures are first-order textbook estimates; for a valve stage they use the typical μ and ra of its ratings row. The real circuit differs with the valve and the parts around it.
doc-network-before-after = { $label }: response before and after the mod
doc-network-response = { $label }: response of the network
doc-network-curves = The curves are the voltage there per volt the source gives unloaded, solved from 20 Hz to 20 kHz.
doc-network-dashed = Dashed grey: before the mod; solid black: after.
doc-network-markers = Each pot setting has its own marker.
doc-network-problem = The network could not be worked out: { $problem }
doc-changed = Changed
doc-col-pot-settings = Pot settings (0–10)
doc-col-corner = Corner or mid scoop
doc-row-change = change
doc-row-before = before
doc-row-after = after
doc-network-method = Solved by modified nodal analysis at 40 points per decade. Audio-taper pots follow two straight segments through 10 % of the track at half rotation (common practice). A corner is where a curve crosses 3 dB below its highest level; a scoop is a dip at least 2 dB below both sides.
doc-network-spice = The solver agrees with a general-purpose circuit simulator (ngspice) within 0.05 dB and 0.5°;
doc-network-netlist = writes the network for one.
doc-col-rate-before = Rate before
doc-col-gain-needed = Gain needed
doc-col-rate-after = Rate after
doc-col-rate = Rate
doc-oscillator-note = The rate is where the network turns the signal through 180°; the stage it feeds back must make up the loss there (the gain needed) for the oscillation to start.
doc-no-mods = The circuit was not modified.
doc-notes = Notes
doc-line-up = Valve line-up
doc-col-channel = Channel
doc-col-position = Position
doc-col-type = Type
doc-col-role = Role
doc-col-rated-as = Rated as
doc-col-fitted = Fitted in a set
doc-no-valves = No valves listed.
doc-measurements-of = Measurements: { $label }
doc-as-handed-over = (as handed over)
doc-set-mains = mains read at { $mains }; figures “at { $nominal }” are corrected to nominal mains by the factor { $factor }.
doc-fitted-bold = Valves fitted for these readings:
doc-fitted-ratings = Their figures use the fitted type’s ratings.
doc-bias-controls = { $count ->
        [one] Bias control:
       *[other] Bias controls:
    }
doc-supply = Supply voltages
doc-col-node = Node
doc-col-feeds = Feeds
doc-col-measured = Measured
doc-col-at = At { $nominal }
doc-col-expected = Expected
doc-col-deviation = Deviation
doc-col-band = Band
doc-col-status = Status
doc-valves-idle = Valves at idle
doc-col-pos = Pos.
doc-col-of-max = of max
doc-col-pct-nominal = % at
    nominal
doc-col-pct-high-line = % at
    high line
doc-idle-from = Idle current found from: { $methods }.
doc-ik-note = “Ik” marks a plate current taken as the whole cathode current, which includes the screen current: those dissipation figures are on the high side (conservative).
doc-limits-note = Limits are the valve ratings listed with the method notes.
doc-window = Fixed-bias target window
doc-col-valve = Valve
doc-col-aim = Aim, %
    of Pa max
doc-col-ia-aim = Ia for
    the aim
doc-col-ia-now = Ia
    now
doc-col-set-to = Set it to
doc-col-reads-now = Reads
    now
doc-grid-middle = about { $volts } on the grid for the middle (estimate)
doc-grid-unknown = no grid estimate for the middle: { $why }
doc-warm-up = Warm-up: idle current against time since power-on
doc-col-time = Time
doc-warm-up-note = Each reading is worked out as the set’s own readings are; the valves table above gives the settled figures.
doc-warm-up-ik = “Ik”: the cathode current, which includes the screen current.
doc-stressed = Stressed parts
doc-col-ref = Ref.
doc-col-where = Where
doc-col-value = Value
doc-col-rating = Rating
doc-col-dissipation = Dissipation
doc-col-pct-rating = % of
    rating
doc-col-at-high-line = At high
    line
doc-col-rated = Rated
doc-col-working = Working
doc-col-high-line = High line
doc-col-cold-start = Cold-start
    peak
doc-col-highest = Highest
doc-col-margin = Margin
doc-col-load-counted = Load counted
doc-col-load-at-least = Load,
    at least
doc-col-rated-output = Rated
    output
doc-valve-rectifier = { $type } valve rectifier
doc-rectifier-note = The rectifier also feeds the rest of the circuit (preamp, phase inverter, any screen and bias supplies), which is not counted here.
doc-heaters = Heater supply
doc-col-heater = Heater
doc-col-nominal = Nominal
doc-col-at-nominal-mains = At nominal
    mains
doc-heater = heater
doc-suggest-heading = Cathode resistor { $reference }: what to fit (an estimate)
doc-suggest-today = Today { $reference } is { $present } under { $valves }; { $calibrated } dissipates { $pa }.
doc-suggest-aiming = Aiming at { $target }, the three-halves power law fitted to these readings gives
doc-suggest-none = no resistor: even none at all would not bring the valve up to the target
doc-col-series = Series
doc-col-fit = Fit
doc-col-about = about
doc-col-ik-each = Ik each
doc-col-resistor-dissipates = Resistor
    dissipates
doc-col-resistor-rating = Resistor rating
doc-rating-at-least = at least { $least } (twice its dissipation): a { $rating } part
doc-estimate-bold = This is an estimate from one set of readings, not a measurement.
doc-estimate = Fit the new resistor, let the valves reach working temperature and measure the bias again before the unit goes back; the measured figures decide.
doc-law = The law: Ik = K × (Vg2k ÷ μg1g2 + Vgk)^1.5 with μg1g2 { $mu } from the ratings table and K = { $constant } fitted so it gives today’s reading exactly; Vk = n × Ik × Rk for the valves sharing the resistor.
doc-law-voltages = The plate and screen voltages are taken as measured (the supply’s sag is ignored)
doc-law-ik = , and the plate current is taken as the whole cathode current, as in the table above
doc-law-series = Values are the nearest IEC 60063 E12 and E24 figures.
doc-bench = On the bench
doc-col-output-power = Output power
doc-col-reading = Reading
doc-col-load = Load
doc-col-frequency = Frequency
doc-col-condition = Condition
doc-col-power = Power
doc-col-pct-rated = % of
    rated
doc-pct-of = { $pct } of { $rated }
doc-col-hum-noise = Hum and noise
doc-col-input = Input
doc-col-volume = Volume
doc-col-across-load = Across
    the load
doc-col-below-full = Below full
    output
doc-col-compared = Compared with
doc-level-into = { $level } into { $load }
doc-nothing-to-compare = nothing to compare with
doc-col-response = Response
doc-row-output-v = Output, V
doc-row-db-against = dB against { $reference }
doc-minus3-points = −3 dB points:
doc-and = and
doc-for-input = , for { $input } in
doc-into-load = into { $load }
doc-response-record = Shown for the record; the response has no pass mark.
doc-col-gain = Gain
doc-col-in = In
doc-col-out = Out
doc-col-ratio = Ratio
doc-measurements = Measurements
doc-no-measurements = No measurements were recorded.
doc-charts = Charts
doc-chart-dissipation = Output valves: plate dissipation against the rating
doc-chart-dissipation-note = Each bar is one valve in one set of readings, at the mains of that day, as a share of its maximum plate dissipation. The heavy line is 100 % of the rating.
doc-chart-supply = Supply chain: node voltages against the chart
doc-chart-supply-note = Grey columns span the expected voltage of each node (the chart figure referred to { $nominal } mains, dashed) plus and minus its tolerance. The markers are the readings corrected to { $nominal } mains.
doc-chart-response = Frequency response on the bench
doc-chart-response-note = Each line is one response reading, in dB against its reference frequency, on a logarithmic frequency axis. The dashed line is −3 dB; the upright ticks on it mark the −3 dB points, found by interpolating between the two readings either side of each.
doc-safety = Electrical safety tests
doc-protection-class = Protection class: { $class }.
doc-col-test = Test
doc-col-limit = Limit
doc-col-result = Result
doc-safety-limits-note = The limits are the ones the shop set for this job. They must follow the rules that apply where the unit is used.
doc-safety-none = The safety block lists no tests.
doc-safety-missing = No electrical safety tests were recorded for this job.
doc-charges = Charges
doc-col-item = Item
doc-col-hours = Hours or
    quantity
doc-col-rate-price = Rate or
    price
doc-col-amount = Amount
doc-labour = Labour
doc-parts-charged = Parts
doc-subtotal = Subtotal
doc-tax-at = { $name } at { $rate }
doc-total = Total, { $currency }
doc-rounding = Each line is rounded to two decimals (halves up)
doc-tax-on-subtotal = ; { $name } is worked out on the subtotal
doc-hand-over = Hand-over
doc-warranty = Warranty
doc-warranty-until = Warranty period: { $period }, from the completion date to { $until }.
doc-warranty-from = Warranty period: { $period } from the completion date.
doc-terms = Terms
doc-signature = Signature
doc-date = Date
doc-handed-over = The unit described above was handed over with this document. The customer confirms receiving the unit and this document, including the mains-safety notice.
doc-sign-technician = Technician
doc-method = Method and assumptions
doc-method-intro = Every figure in this document is either a reading from the job file or worked out from readings by the rules below. Voltages are DC to chassis unless stated. Guide bands marked *common practice* are rules of thumb of the trade with no single published source; figures marked *from memory* are recalled from published data and should be checked against the datasheet. Each band is a setting of the job; the values used here are shown.
doc-ratings-used = Valve ratings used
doc-col-class = Class
doc-col-positions = Positions
doc-col-limits-used = Limits used
doc-col-source-note = Source note
doc-col-from = From
doc-no-types = No valve types were used.
doc-how = How the figures are worked out
doc-m-idle = *Idle current.* With a cathode resistor Rk shared by n valves, each valve’s cathode current is Ik = Vk ÷ (n × Rk); own resistor: n = 1. Across a sense resistor Rs, Ik = Vs ÷ Rs. By the transformer-resistance method, Ia = Vdrop ÷ Rhalf, with Rhalf measured cold and unpowered (divided by n where n valves share one half primary). A shunt across half the primary or a bias probe gives the current directly.
doc-m-matched-cathode = *Matched-pair assumption:* this job uses a shared cathode resistor, so the figures assume the valves on it share the current equally.
doc-m-matched-primary = *Matched-pair assumption:* valves sharing a half primary are taken to share its current equally.
doc-m-screen = *Screen current.* Where a screen resistor gives the screen current, Ig2 = (Vsupply − Vg2) ÷ Rg2 and Ia = Ik − Ig2. Otherwise the plate current is taken as the whole cathode current (Ia = Ik), which includes the screen current: the *conservative rule*, marked “Ik” in the tables, gives dissipation figures on the high side.
doc-m-screen-used = This job’s figures use it.
doc-m-dissipation = *Dissipation.* Plate: Pa = (Va − Vk) × Ia. Screen: Pg2 = (Vg2 − Vk) × Ig2. “% of max” is the figure over the rating in the table above.
doc-m-mains = *Mains correction (first order).* Transformer-fed voltages are taken to scale in proportion to the mains: a reading V made at mains Vm becomes V × Vn ÷ Vm at the nominal Vn = { $nominal }. Currents scale the same way, so dissipation scales with the square: P × (Vn ÷ Vm)². This is an approximation; it ignores regulation and rectifier drop.
doc-m-high-line = *High line.* The supply may sit above nominal by its tolerance t = { $tolerance }, to { $high_line }; projected dissipation is P(nominal) × (1 + t)² and projected voltage V(nominal) × (1 + t). The default tolerances are from memory of the supply standards (+5 % for 120 V service, ANSI C84.1 range A; ±10 % for 230 V, IEC 60038).
doc-m-chart-title = Voltage chart.
doc-m-chart-design = The factory chart was drawn at { $design } mains, so each chart figure is referred to nominal as V(chart) × Vn ÷ Vd with Vd = { $design }.
doc-m-chart-nominal = The chart figures are taken as drawn at nominal mains.
doc-m-chart-band = A node is normal within its band around that expected figure ({ $tolerance } unless the job sets another; common practice, many charts print ±10 % or ±20 %).
doc-m-bands-title = Guide bands (common practice).
doc-m-bands-fixed = Fixed bias, push-pull: aim { $low } to { $high } of Pa max; caution above, “cold” below (crossover distortion risk), over above 100 %.
doc-m-bands-cathode = Cathode bias: caution above { $caution }, over above 100 %.
doc-m-bands-parts = Resistors: caution above { $derating } of their rating (derating), over above 100 %. Filter capacitors: over above the rating, caution when less than { $margin } of it is left. Heaters: { $heater } of nominal. Plate and screen voltages: caution above the published maximum (or when the high-line projection passes it), over more than { $over } above it; guitar amplifiers often run output valves above the design-centre voltage maxima, and plate dissipation governs valve life.
doc-m-window = *Target window.* For fixed bias, the plate current that puts a valve inside the aim is Ia = f × Pa(max) ÷ (Va − Vk) for f from { $low } to { $high }; it is also given as the reading the technician sets (millivolts across a sense resistor, which also carries the screen current, or volts across the half primary).
doc-m-bench = *On the bench.* Readings into a dummy load of the speaker impedance. Output power P = V²rms ÷ R; a peak-to-peak reading of a sine is Vrms = Vpp ÷ (2√2). Readings at clipping or a stated distortion below { $power } of the unit’s rated power are a caution (common practice: a healthy old unit reaches about 80 % or more). Hum and noise in dBV is 20 × log10(V ÷ 1 V); below full output, 20 × log10(Vfull ÷ Vnoise), with Vfull = √(P × R) from the highest output power read at clipping or a stated distortion, else the rated power; less than { $hum } is a caution (common practice). Response in dB is 20 × log10(V ÷ Vref) against the reference frequency; the −3 dB points are interpolated linearly in dB on a logarithmic frequency axis between the readings either side. Gain is 20 × log10(Vout ÷ Vin).
doc-m-estimates = *Bias estimates.* The three-halves power law (Child–Langmuir, as the classic valve handbooks apply it to pentodes; from memory), Ik = K × (Vg2k ÷ μg1g2 + Vgk)^1.5, is fitted to one valve’s readings so it reproduces them exactly; μg1g2 comes from the ratings table (from memory of manufacturer data).
doc-m-estimates-resistor = For a cathode resistor it finds the value that puts the hottest valve on it at { $target } of its plate rating (common practice), with Vk = n × Ik × Rk, and snaps it to the nearest E12 and E24 values of IEC 60063; the resistor’s dissipation is Vk² ÷ Rk and its rating should be at least twice that (common practice).
doc-m-estimates-grid = For fixed bias it gives the grid voltage for the middle of the target window; the window’s current figures stay the authority.
doc-m-estimates-sag = The plate and screen voltages are taken as measured, ignoring the supply’s sag: these are estimates from one point, and the bias must be measured again after any change.
doc-m-stressed = *Stressed parts.* Dropper between two nodes: P = (V1 − V2)² ÷ R. Cathode resistor: P = Vk² ÷ Rk. Both are projected to high line like the valves. A filter capacitor must stand the highest voltage it can see: its working voltage projected to high line, or the cold-start peak, whichever is higher; the margin is what is left of its rating.
doc-m-cold-start = *Cold-start peak:* before the valves draw current, a full-wave winding of Vsec (RMS, each side, rated at primary Vp) charges the first capacitors to about √2 × Vsec × V(high line) ÷ Vp less the rectifier drop (silicon { $drop }; a valve rectifier at no load about 0 V). Silicon and directly heated valve rectifiers really reach it while the output valves warm up.
doc-m-judging = *Judging the unit as it leaves.* The summary on page 1, the at-a-glance panel and the list of open findings speak for the final readings
doc-m-judging-label = (“{ $label }”)
doc-m-judging-rest = , the state the unit is handed over in; the earlier readings are its history. A figure the technician has judged acceptable keeps its status and its numbers in the tables, is marked ACCEPTED with the reason, the name and the date, and no longer counts against the unit. The reason stated for each status names the figure that decided it.

## The mains-safety notice (templates/mains-safety.typ). It is translated
## only as a whole: a translation that lacks any `notice-` key is refused.
## `notice-check-opening` and `notice-check-closing` must be, word for word,
## the opening sentence of `notice-deadly` and the closing sentence of
## `notice-codes`: the program looks for them, with the heading and
## `notice-codes-title`, in the finished PDF.

notice-heading = MAINS SAFETY: READ BEFORE USING OR OPENING THIS UNIT
notice-deadly-title = Deadly voltages
notice-deadly = This amplifier runs on voltages that can kill. While it is switched on, parts inside the chassis carry several hundred volts DC, and the mains wiring carries the full supply voltage.
notice-stored-title = Stored charge
notice-stored = The filter capacitors can keep a dangerous charge long after the amplifier is switched off and unplugged: minutes, hours, sometimes days.
notice-who-title = Who may open it
notice-who = Only a person trained and equipped for this work should open the chassis. Before touching anything inside, discharge the capacitors and measure to make sure they are discharged.
notice-earth-title = Earth
notice-earth = Never remove, cut or bypass the protective-earth conductor of the mains cord, and never use an adapter or plug that lifts the earth. Use only a correctly wired, earthed outlet.
notice-fuses-title = Fuses
notice-fuses = Replace a fuse only with one of the type and rating marked on the unit. A larger fuse does not cure a fault; it lets the fault do more damage.
notice-document-title = This document
notice-document = The measurements describe the unit on the dates given, at the mains voltage then present. They are a record of the work, not a certification of electrical safety, and they say nothing about how the unit will behave later or after other work.
notice-codes-title = Local electrical codes come first.
notice-codes = Mains wiring, earthing and electrical-safety testing must follow the electrical code and regulations in force where the unit is used. Where those rules, or the practice of a licensed electrician, differ from anything in this document, follow them.
notice-check-opening = This amplifier runs on voltages that can kill.
notice-check-closing = Where those rules, or the practice of a licensed electrician, differ from anything in this document, follow them.

## The document's fixed words built by the program (src/report/handover).

doc-title = Hand-over report { $id }: { $make } { $model }
doc-description = Valve amplifier service hand-over for job { $id }
doc-description-shop = Valve amplifier service hand-over for job { $id } from { $shop }
doc-glance-basis = Readings “{ $label }” at { $mains } mains
doc-glance-none = No measurements recorded
doc-group-channel = Channel: { $channel }
doc-group-shared = Shared
period-days = { $count ->
        [one] { $count } day
       *[other] { $count } days
    }
period-weeks = { $count ->
        [one] { $count } week
       *[other] { $count } weeks
    }
period-months = { $count ->
        [one] { $count } month
       *[other] { $count } months
    }
period-years = { $count ->
        [one] { $count } year
       *[other] { $count } years
    }

## Words of the document's rows built by the program
## (src/report/handover/context.rs and context/bench.rs).

doc-window-inside = inside
doc-window-above = above
doc-window-below = below
doc-per-hour = { $price } per hour
doc-each = { $price } each
doc-yes = yes
doc-no = no
role-preamp = preamp
role-phase-inverter = phase inverter
role-output = output
role-rectifier = rectifier
role-tremolo = tremolo
role-reverb-driver = reverb driver
role-reverb-recovery = reverb recovery
role-other = other
doc-type-in-set = { $type } in “{ $set }”
doc-type-change = { $position }: { $type } (line-up: { $line_up })
doc-kind-dropper = dropper
doc-kind-cathode-resistor = cathode resistor
doc-kind-screen-resistor = screen resistor
doc-kind-filter-capacitor = filter capacitor
doc-across-sense-named = across the { $ohms } sense resistor { $reference }
doc-across-sense-value = across the { $ohms } sense resistor
doc-across-sense = across the sense resistor
doc-across-primary-value = across its half primary ({ $ohms })
doc-across-primary-shared = across its half primary ({ $ohms }, shared with { $others })
doc-across-primary = across its half primary
doc-across-probe = cathode current on a bias probe
doc-counted-outputs = the output valves' cathode currents
doc-counted-of = cathode currents of { $valves }
doc-figure-rc-corner = RC corner
doc-figure-cathode-bypass = cathode-bypass corner
doc-figure-stage-gain = stage gain
doc-figure-phase-shift = phase-shift oscillator
doc-chart-band-fixed = The grey band is the fixed-bias aim of { $low }–{ $high } % of the rating.
doc-chart-band-cathode = The dashed line is the cathode-bias caution level of { $caution } % of the rating.
doc-class-one = Class I (protectively earthed)
doc-class-two = Class II (double insulated)
doc-test-earth-continuity = Protective-earth continuity
doc-test-insulation = Insulation resistance
doc-test-leakage = Leakage (touch) current
doc-pass = pass
doc-fail = fail
doc-bands-shop = set by the shop's profile: { $names }
doc-bands-job = set for this job: { $names }
doc-bands-defaults = { $sets }; the others are the built-in defaults
doc-valve-class-output-pentode = output pentode
doc-valve-class-beam-tetrode = beam tetrode
doc-valve-class-power-triode = power triode
doc-valve-class-preamp-triode = preamp triode
doc-valve-class-preamp-pentode = preamp pentode
doc-valve-class-rectifier = rectifier
doc-built-in = built in
doc-input-shorted = shorted
doc-input-open = open
doc-against-rated = rated { $watts }
doc-against-measured = measured { $watts }
doc-below = below { $frequency }
doc-above = above { $frequency }
doc-suggest-hottest = { $valve } ({ $type }), the hottest valve on it,
doc-suggest-asked = The job asks for a suggestion in this set.
doc-suggest-shown = Shown because the plate dissipation is above the { $caution } % cathode-bias guide.
doc-suggest-present = { $watts } W, { $pct } % of { $max }
doc-suggest-target = { $pct } % of { $max }, { $watts } W

## The charts' fixed words (src/report/plots.rs, plots/warm_up.rs,
## response_chart.rs, network_chart.rs), and a mod's network view
## (src/report/handover/context/network_view.rs).

chart-span = { $first } to { $last }
chart-part-readings = readings { $span }
chart-part-curves = curves { $span }
chart-dissipation-axis = Plate dissipation, % of rating
chart-fixed-bias-aim = fixed-bias aim
chart-caution = caution { $pct } %
chart-full-rating = 100 % rating
chart-expected-band = expected ± tolerance
chart-supply-axis = Volts DC, corrected to { $nominal } V mains
chart-db-against-reference = dB against the reference
chart-frequency-axis = Frequency, Hz (logarithmic)
chart-minus-3db-point = −3 dB point
chart-idle-current-ik = Idle current (Ik), mA
chart-idle-current = Idle current, mA
chart-minutes = Minutes since power-on
chart-before-mod = before the mod
chart-after-mod = after
chart-setting = setting { $number }: { $pots }
chart-pots-at = pots at { $pots }
chart-db-at-load = dB at the load
doc-network-scoop = scoop at { $frequency }, { $depth } deep
doc-network-flat = flat within 3 dB
doc-network-low-cut = low cut { $frequency }
doc-network-high-cut = high cut { $frequency }
doc-network-loaded = Read at node { $node }, loaded by { $ohms } to ground.
doc-network-unloaded = Read at node { $node }, unloaded.
doc-network-driven = Driven at node { $node } by { $source }.
doc-network-driven-when = Driven at node { $node } ({ $state }) by { $source }.
doc-network-own-gain = Its own gain, about { $gain }, is left out of the curves.
doc-network-default-label = network
doc-network-never = never 180°
doc-network-pot-setting = { $pot } setting
doc-network-setting = Setting

## The plain-words summary that opens page one (src/report/summary.rs).
## `$names` is a list ("V3 and V4"), `$range` a percentage or a range
## ("67–68 %"), `$troubles` a list of the phrases above it.

summary-valves-hot = { $count ->
        [one] output valve { $names }
       *[other] output valves { $names }
    } running hot ({ $range } of the plate rating)
summary-valves-cold = { $count ->
        [one] output valve { $names }
       *[other] output valves { $names }
    } idling cold ({ $range } of the plate rating)
summary-valves-beyond = { $count ->
        [one] output valve { $names }
       *[other] output valves { $names }
    } beyond the plate rating ({ $range })
summary-valves-high-line = { $count ->
        [one] output valve { $names }
       *[other] output valves { $names }
    } close to the plate rating at the top of the mains range ({ $range })
summary-screen-hot = screen dissipation too high on { $names } ({ $range } of the rating)
summary-voltage-max = valve voltages above the published maximum on { $names }
summary-cathode-current = more than the rated cathode current on { $names }
summary-nodes-off = supply voltages off the factory chart at { $names }
summary-resistor-over = resistor { $name } overloaded at { $pct } of its rating
summary-resistors-over = resistors { $names } overloaded
summary-resistors-warm = { $count ->
        [one] resistor { $names }
       *[other] resistors { $names }
    } running warm
summary-capacitors-over = { $count ->
        [one] capacitor { $names } rated below the voltage it can see
       *[other] capacitors { $names } rated below the voltage they can see
    }
summary-capacitors-margin = little voltage margin on { $count ->
        [one] capacitor { $names }
       *[other] capacitors { $names }
    }
summary-rectifier-load = the rectifier valve { $names } loaded to { $range } of its rating
summary-heater-low = the heater supply { $pct } % low
summary-heater-high = the heater supply { $pct } % high
summary-found-ok = The readings “{ $label }” showed every figure inside its limits.
summary-found = The readings “{ $label }” showed { $troubles }.
summary-parts = { $count ->
        [one] One part was replaced ({ $parts }).
       *[other] { $count } parts were replaced ({ $parts }).
    }
summary-mods = { $count ->
        [one] One modification was made (listed below).
       *[other] { $count } modifications were made (listed below).
    }
summary-type-change = { $position } now holds a { $now } (it held a { $was }).
summary-idle-now = The output valves now idle at { $now } of their plate rating (they were at { $was }).
summary-now-ok = { $accepted ->
        [0] As handed over (“{ $label }”), every figure is inside its limits.
        [one] As handed over (“{ $label }”), every figure is inside its limits, apart from one the technician has judged and accepted (listed below).
       *[other] As handed over (“{ $label }”), every figure is inside its limits, apart from { $accepted } the technician has judged and accepted (listed below).
    }
summary-now-open = As handed over (“{ $label }”), still needing attention: { $troubles }.
summary-no-measurements = No measurements were recorded.
summary-no-safety = No electrical safety tests were recorded.
summary-safety-failed = { $count ->
        [one] The { $tests } test did not meet the shop's limit.
       *[other] The { $tests } tests did not meet the shop's limit.
    }
summary-safety-ok = { $count ->
        [one] The electrical safety test met the shop's limit.
       *[other] All { $count } electrical safety tests met the shop's limits.
    }

## What needs attention, grouped (src/report/attention.rs).

attention-accepted = { $brief } (accepted)

## The listing document (src/report/listing/words.rs): its labels and the
## sentences it builds from the findings.

listing-kicker = Condition report
listing-serviced-by = Serviced by
listing-service-record = service record
listing-the-unit = The unit
listing-make = Make
listing-model = Model
listing-year = Year
listing-serial = Serial
listing-mains = Mains
listing-description = Description
listing-condition = Condition
listing-health = Health as it left the bench
listing-check = Check
listing-state = State
listing-in-words = In words
listing-output-valve = Output valve
listing-valve-type = Type
listing-bias = Bias
listing-idle = Idle, % of plate rating
listing-high-line = At high line
listing-safety-tests = Electrical safety tests
listing-no-safety-tests = No electrical safety tests were recorded.
listing-limit = limit
listing-serviced = What was serviced
listing-part = Part
listing-was = Was
listing-now = Now
listing-why = Why
listing-no-parts = No parts were replaced.
listing-findings = Findings
listing-work = Work done
listing-originality = Originality
listing-item = Item
listing-change = Change
listing-reversible = Reversible
listing-original-kept = Original kept
listing-not-listed = Anything not listed was not changed in this service; whether it is the maker's original was not checked.
listing-notes = Notes
listing-photos = Photos
listing-made-with = Made with ampreport
listing-commit = commit
listing-edits = + edits
listing-job-file-sha = job file SHA-256
listing-page = Page
listing-of = of
listing-bias-fixed = fixed
listing-bias-cathode = cathode
listing-title = Condition report: { $name }
listing-pdf-description = Condition and service summary of a { $name }, for a listing
listing-no-measurements = No measurements were recorded for this service.
listing-all-inside = { $accepted ->
        [0] As it left the bench, every figure measured is inside its limits.
        [one] As it left the bench, every figure measured is inside its limits, apart from one the technician judged acceptable.
       *[other] As it left the bench, every figure measured is inside its limits, apart from { $accepted } the technician judged acceptable.
    }
listing-needs-attention = As it left the bench, still needing attention: { $families }.
listing-accepted-only = inside the limits, apart from what the technician judged acceptable: { $what }
listing-readings = Readings “{ $label }”
listing-at-mains = , at { $volts } mains
listing-state-ok = ok
listing-state-caution = caution
listing-state-over = over
listing-state-cold = cold
listing-state-accepted = accepted
listing-state-not-measured = not measured
listing-change-replaced = replaced
listing-change-modified = modified
listing-parts-replaced = { $count ->
        [0] no parts replaced
        [one] 1 part replaced
       *[other] { $count } parts replaced
    }
listing-no-modifications = no modifications
listing-how-reversible = reversible
listing-all-reversible = all reversible
listing-not-reversible = not stated as reversible
listing-some-reversible = { $count } reversible
listing-modifications = { $count ->
        [one] { $count } modification ({ $how })
       *[other] { $count } modifications ({ $how })
    }
listing-originals-kept = original parts kept: { $list }

## The terminal (`ampreport check`, src/report/terminal.rs). Spaces at the
## start or end of a message are dropped: the program adds them.

term-state-ok = ok
term-state-caution = CAUTION
term-state-over = OVER
term-state-cold = COLD
term-state-accepted = accepted
term-state-unchecked = UNCHECKED
term-job = Job { $id }: { $make } { $model }
term-serial = serial { $serial }
term-mains = Mains: nominal { $nominal }, high line { $high_line } (+{ $tolerance } %)
term-chart-drawn = chart drawn at { $design }
term-safety = Safety tests
term-col-test = test
term-col-reading = reading
term-col-limit = limit
term-col-status = status
term-pass = pass
term-fail = FAIL
term-mod-figures = Modification figures
term-final-set-labelled = “{ $label }”, the final set
term-final-set = the final set
term-no-open = No open findings in { $set }: every figure is inside its limits or accepted.
term-open = Open findings in { $set } ({ $count })
term-accepted-heading = Accepted by the technician ({ $count })
term-word-ok = ok
term-word-caution = caution
term-word-over = over
term-word-cold = cold
term-whole-job = For the whole job
term-history = What was found in “{ $label }”
term-final-mark = final: as handed over
term-set-mains = mains { $mains }, factor { $factor } to nominal
term-fitted = Fitted for these readings: { $position } { $type } (line-up: { $line_up })
term-bias-control-labelled = Bias control { $label }: { $position }
term-bias-control = Bias control: { $position }
term-valves = Valves
term-col-pos = pos
term-col-type = type
term-col-bias = bias
term-col-va = Va
term-col-vk = Vk
term-col-current = current
term-col-pa = Pa
term-col-pct-max = % max
term-col-high-line = high line
term-window-sense = { $low }–{ $high } mV across the sense resistor
term-window-primary = { $low }–{ $high } V across the half primary
term-window-grid = grid about { $volts } for the middle
term-window-grid-unknown = no grid estimate for the middle: { $why }
term-now = now { $volts }
term-estimate = (estimate)
term-window = { $position } target window { $low }–{ $high } %
term-inside = inside
term-outside = outside
term-ik-note = Ik: plate current taken as the cathode current, including screen current (conservative).
term-warm-up = Warm-up (idle current after power-on)
term-col-valve = valve
term-col-after = after
term-col-pa-pct-max = Pa % max
term-nodes = Supply nodes
term-col-node = node
term-col-measured = measured
term-col-corrected = corrected
term-col-expected = expected
term-col-deviation = deviation
term-stressed = Stressed parts
term-col-part = part
term-col-where = where
term-col-stress = stress
term-col-rating = rating
term-col-pct-margin = % / margin
term-peak = { $volts } peak
term-left = { $pct } % left
term-not-checked = not checked ({ $reason })
term-rectifier = Rectifier { $position } ({ $type }): at least { $load } mA of { $rating } mA ({ $pct } %)
term-heater = Heater: { $measured } against { $nominal } ({ $deviation } %)
term-suggestion = Cathode resistor { $reference } ({ $valves }, now { $present }): for { $target } % of Pa max ({ $pa } W) the three-halves law gives { $exact }
term-out-of-reach = no resistor (out of reach)
term-suggestion-option = { $series } { $value }: Vk { $vk }, { $current } each, Pa { $pa } W ({ $pct } %); the resistor dissipates { $power } W: rate it { $least } W or more (a { $rating } part)
term-suggestion-estimate = An estimate from one set of readings ({ $calibrated }, μg1g2 { $mu }); measure the bias again after the change.
term-bench = Bench tests
term-rms = { $volts } rms
term-peak-to-peak = { $volts } p-p = { $rms } rms
term-output-power = Output power
term-output-power-line = { $reading } into { $load } at { $frequency }, { $condition } = { $power } W
term-of-rated = { $pct } of rated
term-hum-noise = Hum and noise
term-hum-noise-line = { $mv } mV ({ $dbv } dBV), input { $input }
term-volume = volume { $volume }
term-below-full = { $db } dB below full output
term-response = Response
term-against = against { $reference }
term-in = { $volts } in
term-col-frequency = frequency
term-col-output = output
term-col-db = dB
term-below-not-reached = below { $frequency } (not reached)
term-above-not-reached = above { $frequency } (not reached)
term-minus-3db = −3 dB: { $low } and { $high }
term-gain = Gain
term-gain-line = { $input } in for { $output } out at { $frequency } = ×{ $times } ({ $db } dB)

## Reasons and thresholds of the checks (src/calc), as the document, the
## terminal and `calc --json` give them, in the shop's language.

reason-includes-screen = (includes screen current, so on the high side)
reason-at-nominal-mains = at nominal mains
reason-plate-dissipation = plate dissipation { $watts } W is { $pct } % of its { $rating } rating
threshold-fixed-bias = fixed-bias aim { $low }–{ $high } % of { $rating }; cold below { $low } %, caution above { $high } %, over above 100 %
reason-above-aim = above the { $high } % aim
reason-below-aim = below the { $low } % aim (crossover distortion risk)
reason-inside-aim = inside the aim
threshold-cathode-bias = caution above { $caution } % of { $rating }, over above 100 %
reason-above-guide = above the { $caution } % guide
threshold-voltage-max = caution above the { $max } maximum (or when the high-line projection is above it), over above { $over } % of it
reason-voltage-of-max = { $what } { $volts } is { $pct } % of its { $max } maximum
reason-voltage-high-line = { $what } would reach { $high } at high line, above its { $max } maximum
reason-voltage-within = { $what } is { $pct } % of its maximum
reason-plate-voltage = plate voltage
reason-screen-voltage = screen voltage
threshold-node = within ±{ $tolerance } % of the chart referred to { $nominal }
reason-node = { $corrected } at nominal mains is { $deviation } % from the expected { $expected }
reason-above-band = above the ±{ $tolerance } % band
reason-below-band = below the ±{ $tolerance } % band
reason-no-chart = no chart figure to compare with
threshold-no-chart = none: the job gives no chart figure
threshold-heater = within ±{ $tolerance } % of { $nominal }
reason-at-nominal = { $volts } at nominal mains ({ $deviation } %)
reason-heater = { $measured } is { $deviation } % from { $nominal }

## Reasons: a figure against its rating, the output valves' other checks
## (src/calc/status.rs, src/calc/valve.rs).

threshold-under-rating = caution above { $caution } % of { $rating }, over above 100 %
reason-of-rating = { $what } is { $pct } % of its { $rating } rating
reason-of-rating-guide = { $what } is { $pct } % of its { $rating } rating, above the { $caution } % guide
reason-plate-high-line = at high line ({ $mains }) the plate would dissipate { $watts } W, { $pct } % of its rating
threshold-plate-high-line = caution when the high-line projection exceeds 100 %
reason-screen-dissipation = screen dissipation
threshold-screen-dissipation = over above 100 % of { $rating }; caution when the high-line projection is above it
reason-screen-high-line = screen dissipation would be { $pct } % of its rating at high line
threshold-cathode-current = over above the { $max } maximum
reason-cathode-current-over = cathode current { $current } is { $pct } % of its maximum
reason-cathode-current = cathode current is { $pct } % of its maximum

## Reasons: resistors, filter capacitors and the valve rectifier
## (src/calc/supply.rs). `place-…` say where a part sits.

reason-dissipation = dissipation { $watts }
reason-resistor-high-line = would dissipate { $watts } at high line, { $pct } % of its rating
reason-resistor-no-rating = dissipates { $watts }; no rating given
threshold-no-power-rating = none: the job gives no power rating
reason-not-measured = { $nodes } not measured
place-between = { $from } to { $to }
place-cathodes = { $count ->
        [one] { $valves } cathode
       *[other] { $valves } cathodes
    }
place-screen = { $valve } screen
place-to-screen = { $node } to { $valve } screen
reason-silicon-rectifier = silicon rectifier
reason-valve-rectifier = { $type } valve rectifier
reason-valve-rectifier-slow = { $type } valve rectifier, indirectly heated
reason-rectifier-not-stated = rectifier not stated, taken as silicon
reason-cap-peak-words = cold-start peak at high line { $mains } ({ $rectifier })
reason-cap-work-words = working voltage at high line { $mains }
threshold-capacitor = over above the { $rating } rating; caution when the margin is under { $margin } %
reason-cap-unchecked = ; the working voltage was not checked: { $node } not measured
reason-cap-both-over = the { $peak }, { $peak_volts }, and the { $work }, { $work_volts }, both exceed the { $rating } rating
reason-cap-work-over = the { $work }, { $work_volts }, exceeds the { $rating } rating
reason-cap-work-over-peak = the { $work }, { $work_volts }, exceeds the { $rating } rating (the { $peak } reaches { $peak_volts }, which a slow-warming rectifier makes less likely)
reason-cap-peak-slow = the { $peak }, { $highest }, exceeds the { $rating } rating; a slow-warming rectifier makes this less likely but not impossible
reason-cap-peak-over = the { $peak }, { $highest }, exceeds the { $rating } rating
reason-cap-margin-low = the { $source }, { $highest }, leaves only { $margin } % margin on the { $rating } rating
reason-cap-margin = highest expected { $highest } ({ $source }) leaves { $margin } % margin
threshold-rectifier = caution above 90 % of the { $rating } rating, over above 100 % (output valves only: a lower bound)
reason-rectifier = the output valves alone draw { $load } mA, { $pct } % of the { $type } { $position }'s { $rating } mA rating

## Reasons: electrical safety tests (src/calc/safety.rs).

safety-limit-with-cord = ≤ { $limit } + cord { $cord } = { $allowed }
safety-earth = protective-earth resistance { $ohms }
safety-insulation-limit = ≥ { $ohms } at { $volts } DC
safety-insulation = insulation resistance { $ohms } at { $volts } DC
safety-leakage = leakage current { $amps }
safety-meets = { $what } meets the limit { $limit }
safety-fails = { $what } fails the limit { $limit }
safety-test-earth-continuity = earth continuity
safety-test-insulation = insulation
safety-test-leakage = leakage

## Reasons: bench tests (src/calc/bench.rs).

bench-at-clipping = at the onset of clipping
bench-at-distortion = at { $pct } % distortion
bench-with-drive = with { $volts } drive
bench-power-into = { $watts } into { $load } { $condition }
bench-power-at-drive = { $power }; read at a stated drive, so not judged against the rating
threshold-power-at-drive = none: only readings at clipping or a stated distortion are judged
threshold-power = caution below { $guide } % of the rated { $rated }
bench-power-below-guide = output power { $power } is { $pct } % of the rated { $rated }, below the { $guide } % guide
bench-power-of-rated = output power { $power } is { $pct } % of the rated { $rated }
bench-power-no-rating = output power { $power }; the job gives no rated power to compare with
threshold-power-no-rating = none: the job gives no rated power
bench-hum-level-shorted = hum and noise { $volts } ({ $dbv } dBV) with the input shorted
bench-hum-level-open = hum and noise { $volts } ({ $dbv } dBV) with the input open
threshold-hum = caution when less than { $guide } dB below full output
bench-rated-full-output = the rated full output of { $watts }
bench-measured-full-output = the measured full output of { $watts }
bench-hum-below-guide = { $level } is only { $db } dB below { $against }, less than the { $guide } dB guide
bench-hum-below = { $level } is { $db } dB below { $against }
bench-hum-no-full = { $level }; no measured or rated full output to compare with
threshold-hum-no-full = none: the job gives no output power reading and no rated power

## A valve's checks and how its idle current was found, in words
## (src/calc/findings.rs).

check-plate-dissipation = plate dissipation
check-plate-dissipation-high-line = plate dissipation high line
check-screen-dissipation = screen dissipation
check-plate-voltage = plate voltage
check-screen-voltage = screen voltage
check-cathode-current = cathode current
check-rectifier-load = rectifier load
method-shared-cathode-resistor = shared cathode resistor
method-own-cathode-resistor = own cathode resistor
method-sense-resistor = sense resistor
method-transformer-resistance = transformer resistance
method-shunt = shunt across half primary
method-probe = bias probe

## The deciding figure of a status in a few words, for a table's status
## column (src/calc/brief.rs). `$pct` carries its own "%".

brief-plate = plate { $pct }
brief-plate-high-line = plate { $pct } at high line
brief-screen = screen { $pct }
brief-voltage-high-line = { $name } { $pct } at high line
brief-voltage-of-max = { $name } { $pct } of max
brief-cathode-current = Ik { $pct } of max
brief-from-chart = { $deviation } % from chart
brief-no-chart = no chart figure
brief-at-high-line = { $pct } % at high line
brief-of-rating = { $pct } % of rating
brief-no-rating = no rating given
brief-working-high-line = working at high line
brief-cold-start-peak = cold-start peak
brief-margin = { $pct } % margin
brief-volts-on-rating = { $volts } { $what } on { $rating }
brief-margin-what = { $pct } % margin, { $what }
brief-of-rated = { $pct } % of rated
brief-below-full = { $db } dB below full
brief-against = { $measured } against { $limit }

## Warnings and the at-a-glance panel (src/calc/mod.rs): what a finding
## is about, and each family's line.

warn-subject-reason = { $subject }: { $reason }
warn-subject-safety = safety
warn-subject-sign-off = sign-off
warn-subject-job = job
warn-subject-heater = heater
warn-subject-heater-labelled = heater { $label }
warn-subject-output-power = output power
warn-subject-hum-noise = hum and noise
warn-subject-on-channel = { $what } ({ $channel } channel)
warn-acceptance-unmatched = the acceptance of { $what } matches no figure outside its limits, so it accepts nothing
warn-accept-node = node { $name }
warn-accept-heater = heater { $name }
warn-accept-heater-supply = the heater supply
warn-accept-safety = the { $name } test
warn-accept-in-set = { $what } in “{ $set }”
warn-not-measured-final = { $what } is not measured in “{ $final }”, the final set (it was in “{ $set }”)
warn-no-sets = The job has no measurement sets, so no figures could be derived.
warn-subject-network = network
warn-network-problem = The network of the mod “{ $what }” could not be worked out: { $problem }.
warn-no-mu-ra = { $position } ({ $type }): the ratings table gives no typical μ and ra, so the mod's stage figure is left out.
figure-rc-corner = { $ohms } with { $farads }: corner { $frequency }
figure-cathode-bypass = { $valve } ({ $type }, μ { $mu }, ra { $ra }): Rk { $rk } bypassed by { $ck } into a { $load } load: corner { $frequency }
figure-gain-bypassed = { $valve } ({ $type }) into { $load }, cathode bypassed: gain about { $gain }
figure-gain-unbypassed = { $valve } ({ $type }) into { $load }, { $rk } unbypassed: gain about { $gain }
figure-phase-shift = three sections of { $ohms } and { $farads }: about { $frequency } (the stage needs a gain of at least { $gain })
note-unknown-type = { $position }: valve type { $type } is not in the ratings table
note-not-checked = { $reference }: not checked, { $reason }
family-output-valves = Output valves against their ratings
family-supply-voltages = Supply voltages against the chart
family-stressed-parts = Stressed resistors, capacitors and rectifier
family-heater = Heater supply
family-bench-tests = Performance on the bench
family-safety-tests = Electrical safety tests
family-no-safety = no safety tests recorded
family-no-bench = no bench tests recorded
family-nothing-measured = nothing measured
family-check-of = { $check } of { $names }
family-accepted = accepted by the technician: { $what } (reasons below)
family-safety-ok = all { $count } tests meet their limits
family-valves-ok = { $count ->
        [one] { $count } output valve inside their ratings
       *[other] { $count } output valves inside their ratings
    }; hottest { $hottest } at { $pct } % of its plate rating
family-nodes-ok = { $count ->
        [one] { $count } node
       *[other] { $count } nodes
    } within tolerance of the chart; largest deviation { $deviation } % at { $node }
family-busiest-resistor = busiest resistor { $reference } at { $pct } % of its rating
family-least-margin = least capacitor margin { $pct } % ({ $reference })
family-rectifier-load = rectifier { $position } at { $pct } % of its rating
family-heater-ok = { $measured } against { $nominal } ({ $deviation } %)
family-bench-power = { $watts } W into { $load } { $condition }
family-bench-power-rated = { $watts } W into { $load } { $condition } ({ $pct } % of rated)
family-bench-hum-below = hum and noise { $db } dB below full output
family-bench-hum = hum and noise { $volts } ({ $dbv } dBV)
family-bench-response-both = −3 dB at { $low } and { $high }
family-bench-response-low = −3 dB at { $low }, within 3 dB up to { $high }
family-bench-response-high = within 3 dB down to { $low }, −3 dB at { $high }
family-bench-response-flat = within 3 dB from { $low } to { $high }
family-bench-gain = gain { $db } dB

## Notes on readings that could not be used (src/calc). Each starts with
## what it is about and a colon.

note-screen-above-supply = { $position }: the screen reads { $screen } but its supply { $supply } reads { $volts }; the screen current is left out
note-no-idle-current = { $position }: no reading gives the idle current (read the cathode, sense-resistor or half-primary voltage, or a current)
note-no-half-primary = { $position }: a half-primary drop is given but the circuit has no half-primary resistance for { $position }
note-no-sense-resistor = { $position }: a sense-resistor voltage is given but the circuit has no sense resistor for { $position }

note-unfit-no-mu = the ratings table gives no { $factor } for { $type }
note-unfit-no-plate = there is no plate reading
note-unfit-no-screen = there is no screen reading
note-unfit-no-current = no reading gives the idle current
note-unfit-no-grid = there is no grid reading
note-unfit-cut-off = its readings put it at or beyond cut-off by the three-halves law (μ { $mu }), so the law cannot be fitted
note-no-suggestion-figure = { $reference }: no cathode-resistor suggestion, since no valve on it has a plate-dissipation figure
note-no-suggestion-unfit = { $reference }: no cathode-resistor suggestion, since for { $valve } { $why }
note-no-suggestion-reach = { $reference }: no cathode resistor brings { $valve } up to { $pct } % of its plate rating by the three-halves law

## Lists in running text: "V3, V4 and V5".

list-and = { $first } and { $last }

## Diagnostics: problems in job files, shop profiles, translation files
## and photos (src/job, src/shop, src/photo, src/units), said in the shop
## profile's language (docs/shop.md, "The terminal's language"). Keep
## English as it is: tests compare it word for word. `file` is `job` or
## `shop`; `what` is a name already said ("`anode`", "a `key` property").

diag-file-warnings = { $name }: { $warnings ->
        [one] 1 warning
       *[other] { $warnings } warnings
    }
diag-file-refused = { $name }: { $errors ->
        [one] 1 problem stops
       *[other] { $errors } problems stop
    } this { $file ->
        [shop] shop profile
        [translation] translation file
       *[job] job file
    } from being read
diag-file-refused-warnings = { $name }: { $errors ->
        [one] 1 problem stops
       *[other] { $errors } problems stop
    } this { $file ->
        [shop] shop profile
        [translation] translation file
       *[job] job file
    } from being read ({ $warnings ->
        [one] 1 warning
       *[other] { $warnings } warnings
    } too)
diag-not-shown = { $count ->
        [one] 1 more problem is
       *[other] { $count } more problems are
    } not shown: fix the { $shown } above and run again
diag-allowed-here = allowed here: { $names }
diag-did-you-mean = did you mean `{ $name }`?
diag-did-you-mean-either = did you mean { $names } or `{ $last }`?
diag-in-job-file = the job file
diag-in-shop-profile = the shop profile
diag-in-set = a measurement set
diag-unknown-node = unknown node `{ $name }` in { $context }
diag-unknown-node-label = not a node this format knows here
diag-type-annotation = type annotation `({ $type })` is not used in job files
diag-remove-this = remove this
diag-type-annotation-help = write the unit inside the value instead, for example "352V"
diag-takes-no-properties = `{ $node }` takes no properties
diag-unknown-property = unknown property `{ $key }` on `{ $node }`
diag-unknown-property-label = not a property of this node
diag-repeated-property = property `{ $key }` is given twice on `{ $node }`
diag-repeated-here = repeated here
diag-takes-no-values = `{ $node }` takes no plain values; use its properties
diag-takes-values = `{ $node }` takes { $count ->
        [one] 1 plain value
       *[other] { $count } plain values
    }
diag-extra-value = unexpected value on `{ $node }`
diag-not-expected-here = not expected here
diag-no-children = `{ $node }` takes no child nodes
diag-missing = `{ $node }` needs { $what }
diag-missing-label = { $what } missing
diag-for-example = for example: { $example }
diag-a-property = a `{ $key }` property
diag-found-text = the text "{ $text }"
diag-found-number = the number { $number }
diag-expected-text = { $what } must be text, found { $found }
diag-expected-text-label = expected text in quotes
diag-expected-text-help = write it in double quotes, for example "{ $example }"
diag-expected-name = { $what } must be a name such as V1 or B+1, found { $found }
diag-expected-name-label = expected a name
diag-expected-bool = { $what } must be #true or #false, found { $found }
diag-expected-bool-label = expected #true or #false
diag-expected-bool-help = KDL 2 writes booleans as #true and #false
diag-expected-integer = { $what } must be a whole number from { $low } to { $high }
diag-expected-integer-label = expected a whole number
diag-expected = expected { $what }
diag-must-be-kind = { $what } must be { $kind }, found { $found }
diag-out-of-range-kind = { $what }: { $written } is outside the range accepted for { $kind } ({ $range })
diag-out-of-range-help = no reading or part has this value; check the prefix and the exponent
diag-this-value = this value
diag-bad-value = { $what }: { $problem }
diag-write-kind-as = write { $kind } as { $example }
diag-bad-time = { $what } must be a time since power-on, up to a day
diag-bad-time-label = expected a time such as "5min"
diag-bad-time-help = write minutes as a number (5), or text with s, min or h: "30s", "5min", "1.5h"
diag-date-not-text = { $what } must be a date in quotes, found { $found }
diag-date-label = expected "YYYY-MM-DD"
diag-date-help = write dates as ISO 8601 text, for example "2026-11-02"
diag-bad-date = { $what } "{ $text }" is not a valid date ({ $error })
diag-bad-date-help = write dates as ISO 8601 year-month-day, for example "2026-11-02"
diag-date-out-of-range = there is no such month or day
diag-date-too-short = it ends before the date is complete
diag-date-too-long = there is more after the date
diag-date-not-ymd = it is not written as year-month-day
diag-must-be-from = { $what } must be from { $range }
diag-cannot-be-negative = { $what } cannot be negative
diag-cannot-be-zero = { $what } cannot be zero
diag-zero-or-more = expected zero or more
diag-more-than-zero = expected more than zero
diag-impossible-help = a physical part or supply cannot have this value; check the reading
diag-leads-reversed-help = this reading cannot be below zero unless the meter’s leads were the wrong way round: check it, and if they were, enter it without the minus sign
diag-range = { $low } to { $high }
diag-kind-voltage = a voltage
diag-kind-current = a current
diag-kind-resistance = a resistance
diag-kind-power = a power
diag-kind-capacitance = a capacitance
diag-kind-inductance = an inductance
diag-kind-frequency = a frequency
diag-kind-percent = a percentage
diag-unit-empty = the value is empty
diag-unit-not-a-number = this is not a number with an optional SI prefix or an RKM code
diag-unit-wrong = "{ $symbol }" is the unit of { $found }, but { $expected } belongs here
diag-unit-rkm = the RKM letter R marks the decimal point of a resistance, but { $expected } belongs here
diag-unit-no-prefix = { $expected } takes no SI prefix
diag-unit-not-finite = the value is too large to be a measurement

diag-given-more-than-once = `{ $name }` is given more than once
diag-merge-nodes = a job file has one `{ $name }` node; merge them
diag-format-too-new = this job file uses format { $found }, but this ampreport reads format { $known } at most
diag-format-version = format version
diag-update-program = update ampreport to read this file
diag-needs-version = `{ $name }` needs the version number
diag-version-missing = version missing
diag-write-format = write `job-format 1`
diag-no-format = the job file does not say which format it uses
diag-start-of-file = start of file
diag-begin-with-format = begin the file with `job-format 1`
diag-is-shop-profile = this is a shop profile, not a job file
diag-is-ratings-file = this is a ratings file, not a job file
diag-not-a-job-file = not a job file
diag-is-shop-profile-help = a shop profile is found by itself (shop.kdl beside the job or in a folder above it), or named with --shop FILE; give the job file here
diag-is-ratings-file-help = a ratings file is named with --ratings FILE; give the job file here
diag-no-node = the job file has no `{ $name }` node
diag-add = add: { $example }
diag-two-final-sets = more than one measurement set is marked `final`
diag-second-final = a second final set
diag-two-final-help = the final set is the state the unit is handed over in: mark only one
diag-repeated-set = there are two measurement sets labelled "{ $label }"
diag-repeated-label = repeated label
diag-dates-out-of-order = the job is completed ({ $completed }) before it was received ({ $received })
diag-completed-before = completed before received
diag-given-twice = `{ $name }` is given twice
diag-wide-tolerance = a supply tolerance of { $pct }% is unusually wide
diag-unusual = unusual
diag-unusual-mains = { $volts } V is not a usual mains voltage
diag-unusual-mains-label = unusual nominal mains
diag-unknown-role = unknown valve role `{ $name }`
diag-expected-role = expected a role
diag-valve-needs-role = `valve` needs a `role` property
diag-role-missing = role missing
diag-one-of = one of: { $names }
diag-position-twice = valve position { $position } is listed twice
diag-unknown-bias = unknown bias kind `{ $name }`
diag-expected-bias = expected cathode or fixed
diag-large-sense = a { $value } sense resistor is unusually large
diag-sense-help = sense resistors are usually 1 Ω or 10 Ω
diag-node-declared-twice = node { $name } is declared twice
diag-needs-voltage = `{ $name }` needs the voltage read
diag-voltage-missing = voltage missing
diag-node-read-twice = node { $name } is read twice in this set
diag-type-twice = the type of { $position } is given twice in this set
diag-valve-read-twice = valve { $position } is read twice in this set
diag-warm-up-help = readings at times during a warm-up go in a `warm-up` block with `after=`
diag-warm-up-type = a warm-up reading cannot change the valve's type
diag-not-here = not here
diag-warm-up-type-help = give the set's type on the set's own `valve` line
diag-warm-up-time = a warm-up reading needs the time since power-on
diag-time-missing = time missing
diag-warm-up-nothing = a warm-up reading needs something read (cathode, sense, primary-drop or current)
diag-nothing-read = nothing read
diag-read-twice-same-time = { $position } is read twice at the same time
diag-unknown-method = unknown current method `{ $name }`
diag-expected-method = expected probe or shunt
diag-method-help = probe: a bias probe under the valve (cathode current); shunt: an ammeter across half the primary (plate current)
diag-current-needs-method = a current read directly needs its method
diag-method-missing = method missing
diag-add-method = add method=probe (bias probe: cathode current) or method=shunt (shunt across half the primary: plate current)
diag-method-without-current = `method` is given without a `current`
diag-no-current = no current to go with it

diag-undeclared-node = node { $name } in “{ $set }” is not declared in `circuit`, so it has no chart figure and no part uses it
diag-not-declared-node = not a declared node
diag-declare-node-or = did you mean `{ $near }`? Otherwise declare it in `circuit`: node { $name } chart="…"
diag-declare-node = declare it in `circuit`: node { $name } chart="…"
diag-node-only-here = node { $name } is read only in “{ $set }”; another set reads { $near }
diag-different-name = a different name from the other sets
diag-node-named = node { $name }
diag-not-in-final = { $what } is not measured in “{ $final }”, the final set (it was in “{ $set }”)
diag-not-measured-in = not measured in “{ $final }”
diag-read-again = read it again in “{ $final }”, or the document cannot say how it stands as the unit leaves
diag-mains-far = mains of { $mains } in "{ $set }" is { $pct }% from the nominal { $nominal }
diag-far-from-nominal = far from nominal
diag-mains-far-help = check the reading, or whether the unit ran from a variable autotransformer
diag-output-role-mismatch = { $position } is listed as an output valve, but the ratings table has { $type } as a { $class }
diag-unusual-role = unusual role for this type
diag-rectifier-mismatch = { $position } is listed as the rectifier, but { $type } is a { $class }
diag-not-a-rectifier = not a rectifier
diag-unknown-valve-type = unknown valve type "{ $type }" at { $position }
diag-not-in-ratings = not in the ratings table
diag-rectifier-not-rectifier = the rectifier is { $position } ({ $type }), which is not a rectifier valve
diag-write-silicon = write `rectifier silicon` for a solid-state rectifier
diag-incomplete = the { $file ->
        [shop] shop profile
        [translation] translation file
       *[job] job file
    } is incomplete
diag-here = here
diag-bare-value = KDL syntax: `{ $value }` is not a number, so it must be written in quotes
diag-needs-quotes = needs quotes
diag-bare-value-help = write "{ $value }": a value with a unit, or a name that starts with a digit, is text in double quotes
diag-kdl-syntax = KDL syntax: { $problem }
diag-kdl-broken = the KDL syntax is broken here
diag-kdl-help = job files are KDL 2.0: text in double quotes, booleans as #true/#false, one node per line

diag-merge-shop-nodes = a shop profile has one `{ $name }` node; merge them
diag-shop-no-format = the shop profile does not say which format it uses
diag-begin-with-shop-format = begin the file with `shop-format 1`
diag-shop-no-node = the shop profile has no `{ $name }` node
diag-logo-name-empty = the logo's file name is empty
diag-expected-file-name = expected a file name
diag-bad-pattern = the job-number pattern `{ $pattern }` cannot be used: { $why }
diag-expected-pattern = expected a pattern such as D-{"{"}yymm{"}"}-{"{"}nnn{"}"}
diag-pattern-help = pieces: {"{"}yyyy{"}"} {"{"}yy{"}"} {"{"}mm{"}"} {"{"}dd{"}"} {"{"}yymm{"}"}, and one count {"{"}n…{"}"} (one n per digit)
diag-not-language-tag = `{ $tag }` is not a language tag
diag-expected-language-tag = expected a language tag such as en or de
diag-built-in-languages = built in: { $tags }
diag-no-catalogue = the program has no catalogue for `{ $tag }` built in
diag-no-built-in-catalogue = no built-in catalogue
diag-own-translation = { $suggestion }; or give your own translation: language "{ $tag }" file="{ $tag }.ftl"
diag-shop-format-too-new = this shop profile uses format { $found }, but this ampreport reads format { $known } at most
diag-write-shop-format = write `shop-format 1`
diag-shop-name-empty = the shop's name is empty
diag-expected-the-name = expected the name
diag-unknown-paper = unknown paper size `{ $name }`
diag-expected-paper = expected a4 or letter
diag-bad-period = `period` "{ $text }" is not a length of time
diag-expected-period = expected a number and days, weeks, months or years
diag-period-help = for example period="90 days", "6 months" or "1 year"

diag-charges-currency = `charges` needs a currency
diag-currency-missing = currency missing
diag-charges-currency-help = write charges currency="GBP" {"{"} … {"}"}, or set the currency in the shop profile's `charges` node
diag-charges-too-large = the charges are too large to add up
diag-these-charges = these charges
diag-charge-both = a line with `amount` takes no `{ $count }` or `{ $price }`
diag-charge-both-label = remove this, or the amount
diag-charge-both-help = write either amount="…" or { $count }=… { $price }="…"
diag-labour-needs = `hours` and `rate`, or an `amount`
diag-part-needs = a `price` (and a `quantity`), or an `amount`
diag-amount-missing = amount missing
diag-currency-code = `currency` must be a short code or sign (1 to 8 characters)
diag-expected-currency = expected a currency
diag-currency-help = for example currency="GBP", "EUR", "USD" or "€"
diag-tax-rate = `tax-rate` must be a percentage from 0% to 100%, found `{ $found }`
diag-expected-percentage = expected a percentage
diag-tax-rate-help = for example tax-rate="20%" or tax-rate="8.875%"
diag-charges-no-sign = charges lines add up; write the amount without a sign
diag-money-too-large = { $what } is too large (the limit is { $limit })
diag-too-large = too large
diag-too-many-places = { $what } has more than { $places } decimal places
diag-too-many-decimals = too many decimals
diag-plain-decimal = { $what } must be a plain decimal number, found `{ $found }`
diag-expected-money = expected a number such as 48.00
diag-money-help = write money and hours with a decimal point and no currency sign or thousands separator, for example "1250.00"
diag-expected-a-number = expected a number

diag-photo-absolute = the photo `{ $path }` is an absolute path
diag-photo-outside = the photo `{ $path }` is not a path inside the job's folder
diag-photo-relative = expected a path relative to the job file
diag-photo-keep-inside = keep photos in the job's folder or a folder below it and name them from there, for example photo "photos/chassis.jpg"
diag-photo-link = the photo `{ $path }` is a link that leads outside the job's folder (to { $target })
diag-leads-outside = leads outside
diag-photo-copy = copy the photo into the job's folder instead of linking to it
diag-photo-not-file = the photo { $path } is not a regular file
diag-not-a-file = not a file
diag-photo-png-jpeg = a photo must be a PNG or JPEG file
diag-photo-too-large = the photo { $path } is { $size } MB; the limit is { $limit } MB
diag-photo-smaller = export the photo smaller (a document prints it about 8 cm wide; 2000 pixels across is plenty)
diag-photo-cannot-read = cannot read the photo { $path }: { $error }
diag-this-file = this file
diag-photo-check-path = check the path: it is relative to the job file's folder
diag-photo-not-image = the photo { $path } is not a PNG or JPEG picture (its content is { $content ->
        [empty] empty
        [text] text
       *[other] neither
    })
diag-not-a-picture = not a picture
diag-photo-content-matters = a photo must be a PNG or JPEG file; the name's extension does not matter, the content does
diag-photo-undecodable = the photo { $path } { $why }
diag-photo-save-again = open the photo in an image editor and save it again as PNG or JPEG

diag-part-needs-reference = `part` needs a circuit reference or `what=`
diag-which-part = which part?
diag-second-network = a mod has one `network`; this is a second
diag-unknown-class = unknown protection class `{ $name }`
diag-expected-class = expected I or II
diag-needs-reading = `{ $name }` needs the reading
diag-reading-missing = reading missing
diag-unknown-safety-test = unknown safety test `{ $name }`
diag-not-a-safety-test = not a safety test
diag-unknown-check = unknown valve check `{ $name }`
diag-not-a-check = not a check
diag-empty-reason = an acceptance needs its reason in words
diag-empty-reason-label = empty reason
diag-acceptance-who = an acceptance needs the name of the technician who accepted it
diag-who-accepted = who accepted this?
diag-acceptance-when = an acceptance needs the date it was accepted
diag-when-accepted = when was this accepted?
diag-needs-value = `{ $name }` needs a value
diag-value-missing = value missing

## The KDL parser's own words, where the program knows them
## (src/job/kdl_words.rs): the `$problem` of `diag-kdl-syntax`, its label
## and its help. `$what` is one of the `diag-kdl-thing-…` words. Words of
## the parser not listed here are quoted as it wrote them.

diag-kdl-expected = expected { $what }
diag-kdl-not = not { $what }
diag-kdl-end-of-document = expected the end of the file
diag-kdl-no-closing-brace = a block of child nodes is not closed with `{"}"}`
diag-kdl-newline-in-string = a line break inside a single-line quoted string
diag-kdl-no-closing-quote = the closing quote of a string is missing
diag-kdl-no-closing-quotes = the closing quotes of a multi-line string are missing
diag-kdl-multiline-prefix = each line of a multi-line string must start with the closing line's indentation
diag-kdl-bad-node-name = this cannot be a node name
diag-kdl-block-without-name = a block of child nodes where a node name belongs
diag-kdl-bad-fraction = a character that is not a digit after the `.` of a number
diag-kdl-bad-exponent = a character that is not a digit in the exponent of a number
diag-kdl-bad-type-annotation = the type annotation holds something it may not
diag-kdl-raw-string-shape = a single-line raw string may not look like a multi-line one
diag-kdl-negative-unsigned = a negative number where a number without sign belongs
diag-kdl-thing-node-name = a node name
diag-kdl-thing-identifier = a name
diag-kdl-thing-quoted-string = a quoted string
diag-kdl-thing-raw-string = a raw string
diag-kdl-thing-multiline-string = a multi-line string
diag-kdl-thing-property-value = a property value
diag-kdl-thing-type-name = a type name
diag-kdl-thing-keyword = a keyword
diag-kdl-thing-integer = a whole number
diag-kdl-thing-float = a decimal number
diag-kdl-thing-binary = a binary number
diag-kdl-thing-octal = an octal number
diag-kdl-thing-hexadecimal = a hexadecimal number
diag-kdl-thing-newline = a line break
diag-kdl-thing-end = the end of the file
diag-kdl-thing-comment-end = the end of a multi-line comment
diag-kdl-thing-closing-quotes = the closing quotes
diag-kdl-thing-unicode-escape = a Unicode escape
diag-kdl-help-escape = did you forget to escape something?
diag-kdl-help-node-name = did you forget the node's name, or end the node before its block of child nodes?
diag-kdl-help-terminator = a value was read in part but does not end here; did you want a space?
diag-kdl-help-exponent = a number with an exponent looks like 2.0e123 or 43.3E-4
diag-kdl-help-string = any kind of string will do: quoted, raw, multi-line or a plain name

## Diagnostics of a mod's `network` block (src/job/network/decode.rs).

diag-in-a-node = a `{ $node }`
diag-what-reference = a reference
diag-net-label = the network's label
diag-net-needs-source = a `network` needs a `source`
diag-net-source-missing = source missing
diag-net-needs-load = a `network` needs a `load`: the node the response is read at
diag-net-load-missing = load missing
diag-net-speed-not-pot = the speed control { $name } is not a pot of this network
diag-net-no-such-pot = no such pot
diag-net-add-speed-pot = add the speed pot as `pot REF value=… ccw=… wiper=…`
diag-net-one-node = a network has one `{ $node }`; this is a second
diag-net-part-twice = the network already has a part { $name }
diag-net-repeated-reference = repeated reference
diag-net-own-reference = give each part its own reference
diag-net-not-ground = `{ $name }` is not the reference node's name in a job file
diag-net-write-ground = write `ground`
diag-net-ground-help = the reference node of a network is written `ground`
diag-net-impedance-no-valve = a source with a given `impedance` takes no valve figures
diag-net-not-with-impedance = not with `impedance`
diag-net-impedance-or-valve = give either `impedance=`, or `valve=` with `plate-load=`
diag-net-source-impedance = a source impedance
diag-net-valve-and-impedance = a source is either a valve stage or has a given `impedance`, not both
diag-net-remove-one = remove one
diag-net-valve-impedance-help = the valve's output impedance comes from its ra and the plate load
diag-net-plate-load = a plate load
diag-net-cathode-resistor = a cathode resistor
diag-net-needs-valve = a plate load or cathode resistor needs the source's `valve=`
diag-net-no-valve-named = no valve named
diag-net-load-resistance = a load resistance
diag-net-track-resistance = a pot's track resistance
diag-net-pot-needs-end = a pot needs at least one end of its track connected (`ccw=` or `cw=`)
diag-net-no-end = no end connected
diag-net-pot-needs-setting = a pot needs its wiper `setting` (0 to 10; several may be listed, "3 7")
diag-net-setting-missing = setting missing
diag-net-same-node = { $part } connects node `{ $name }` to itself
diag-net-same-node-label = same node twice
diag-net-same-node-help = each terminal of a part goes to a different node
diag-net-unknown-taper = unknown pot taper `{ $name }`
diag-net-expected-taper = expected linear or audio
diag-net-bad-setting = a pot setting runs from 0 to 10, found { $found }
diag-net-expected-setting = expected 0 to 10
diag-net-setting-help = write one setting, setting=5, or several in quotes, setting="3 7"
diag-net-found-word = `{ $word }`
diag-net-found-nothing = nothing
diag-net-too-many-settings = a pot may list at most { $max } settings, found { $count }
diag-net-too-many = too many
diag-net-part-reference = a part's reference
diag-net-no-part-to-change = the network has no part { $name } to change
diag-net-no-part-to-remove = the network has no part { $name } to remove
diag-net-no-such-part = no such part
diag-net-no-parts-yet = the network has no parts yet
diag-net-fit-new-part = { $suggestion }; to fit a new part, write it as `resistor { $name } value=… from=… to=…` (or capacitor, inductor, link, pot)
diag-net-link-no-value = { $name } is a link and has no value
diag-net-not-for-link = not for a link
diag-net-not-a-pot = { $name } is not a pot, so it has no `{ $key }`
diag-net-only-pots = only for pots
diag-net-nothing-to-change = `change { $name }` says nothing to change
diag-net-nothing-changed = nothing changed
diag-net-give-pot-change = give `value=`, `setting=` or `taper=`
diag-net-give-value = give the new `value=`
diag-net-change-or-replace = to change it write `change { $name } value=…`; to replace it, `remove { $name }` first
diag-net-empty-after = the `after` block changes nothing
diag-net-no-edits = no edits
diag-net-empty-after-help = write the edits that make the network as left: change, remove, or a new part

## Diagnostics of a network's shape (src/job/network/check.rs). `after`
## is `yes` for the network as the mod's edits leave it; `parts` and
## `nodes` are lists made with `diag-list-pair` and `diag-list-more`.

diag-list-pair = { $first } and { $last }
diag-list-more = { $first }, { $rest }
diag-net-settings-before-after = the network lists { $before } settings before and { $after } after; the curves are compared setting by setting
diag-net-settings-differ = settings do not line up
diag-net-settings-before-after-help = list the same number of settings before and after (or one)
diag-net-speed-removed = the speed pot { $name } is removed by the mod's edits
diag-net-not-as-left = not in the network as left
diag-net-no-mu-ra = { $position } ({ $type }) has no typical μ and ra in the ratings table, so its output impedance cannot be worked out
diag-net-no-mu-ra-label = no μ and ra
diag-net-no-mu-ra-help = give the source's `impedance=` instead, or add μ and ra to the ratings row (--ratings)
diag-net-the-source = the source
diag-net-the-load = the load
diag-net-pot-end = { $name } ({ $side } end to wiper)
diag-net-source-on-ground = the source cannot sit on `ground`: it drives a node against ground
diag-net-source-on-ground-label = source on ground
diag-net-load-on-ground = the response cannot be read at `ground`: name the node the load hangs on
diag-net-load-on-ground-label = load on ground
diag-net-ideal-loop = { $parts } form a loop of ideal connections{ $after ->
        [yes] {" "}after the mod's edits
       *[no] {""}
    }{ $shorted ->
        [yes] {" "}(the ideal source is shorted)
       *[no] {""}
    }: the network cannot be solved
diag-net-closes-loop = closes a loop
diag-net-shorted-source-help = give the source its output `impedance=` or a `valve=`, or take out the link that shorts it
diag-net-ideal-loop-help = take out one of the links: two ideal paths between the same nodes say nothing more than one
diag-net-floating = { $count ->
        [one] node { $nodes } connects
       *[other] nodes { $nodes } connect
    } to nothing that reaches ground{ $after ->
        [yes] {" "}after the mod's edits
       *[no] {""}
    } (only { $parts }): the network cannot be solved
diag-net-floating-label = floating
diag-net-floating-help = connect { $count ->
        [one] it
       *[other] them
    } to the rest of the network, or check the node names for a typing slip
diag-net-load-unreached = no part leads from the source's node `{ $source }` to the load's node `{ $load }`{ $after ->
        [yes] {" "}after the mod's edits
       *[no] {""}
    }, so the response is nil
diag-net-load-unreached-label = not reached from the source
diag-net-load-unreached-help = check the node names of the parts between them
diag-net-pot-settings-differ = { $pot } lists { $count } settings but { $first } lists { $first_count }{ $after ->
        [yes] {" "}after the mod's edits
       *[no] {""}
    }: the k-th setting of every pot makes the network's k-th setting
diag-net-pot-settings-help = list the same number of settings on each pot, or one setting for a pot that stays put

## Diagnostics of bench tests (src/job/decode_bench.rs).

diag-two-hints = { $first }; { $second }
diag-out-of-range = out of range
diag-bench-a-frequency = a frequency
diag-bench-load-resistance = the load resistance
diag-bench-unusual-load = a dummy load of { $load } is unusual
diag-bench-unusual-load-help = dummy loads are usually 4 Ω, 8 Ω or 16 Ω, the speaker impedance
diag-bench-rms-and-pp = `output-power` gives both `rms` and `peak-to-peak`
diag-bench-one-reading = one reading only
diag-bench-rms-or-pp = give the reading once: rms="15.5V" or peak-to-peak="44V"
diag-bench-power-needs-volts = `output-power` needs the output voltage, saying whether it is RMS or peak-to-peak
diag-bench-the-output-voltage = the output voltage
diag-bench-an-output-voltage = an output voltage
diag-bench-unusual-power = { $volts } into { $load } would be { $watts } W, unusual for a valve amplifier
diag-bench-unusual-power-help = check the reading, its kind (rms or peak-to-peak) and the load
diag-bench-at-help = write at=clipping (the onset of clipping), a distortion such as at="5%", or the input drive such as at="0.5V"
diag-bench-needs-at = `output-power` needs the condition it was read at (`at=`)
diag-bench-condition-missing = condition missing
diag-bench-the-distortion = the distortion
diag-bench-distortion-range = a distortion must be above 0 % and below 100 %
diag-bench-the-input-drive = the input drive
diag-bench-an-input-drive = an input drive
diag-bench-bad-at = `at` must be clipping, a distortion or a drive voltage, found { $found }
diag-bench-expected-at = expected clipping, "5%" or "0.5V"
diag-bench-the-hum-reading = the hum and noise reading
diag-bench-hum-needs-volts = `hum-noise` needs the RMS volts read across the load
diag-bench-a-hum-reading = a hum and noise reading
diag-bench-hum-high = { $volts } of hum and noise is very high
diag-bench-hum-high-help = hum and noise is usually read in millivolts, for example "4.2mV"
diag-bench-bad-input = `input` must be shorted or open, found { $found }
diag-bench-expected-input = expected shorted or open
diag-bench-hum-needs-input = `hum-noise` needs to say whether the input was shorted or open
diag-bench-input-missing = input state missing
diag-bench-an-input-level = an input level
diag-bench-point-needs = `point` needs a frequency and the output volts read there
diag-bench-the-frequency = the frequency
diag-bench-response-voltage = an output voltage on a response
diag-bench-point-twice = { $frequency } is read twice in this response
diag-bench-response-empty = `response` holds no readings
diag-bench-no-points = no `point` children
diag-bench-no-reference-point = the response has no reading at its reference frequency { $frequency }
diag-bench-no-point-here = no point here
diag-bench-no-reference-point-help = add a `point` at the reference frequency, or set reference= to a frequency that was read
diag-bench-an-input-voltage = an input voltage

## Diagnostics of the job file's blocks (src/job/decode.rs). `diag-what-…`
## name what a value is, for messages such as `diag-cannot-be-negative`.

diag-what-job-format = the job-file format version
diag-what-rated-power = the rated output power
diag-what-nominal-mains = the nominal mains voltage
diag-what-mains-frequency = the mains frequency
diag-what-design-mains = the design mains voltage
diag-what-supply-tolerance = the supply tolerance
diag-what-position = a position
diag-what-bias-kind = the bias kind
diag-what-the-reference = the reference
diag-what-node-name = a node name
diag-what-chart-voltage = the chart voltage
diag-what-voltage-rating = a voltage rating
diag-what-winding-voltage = the winding voltage
diag-what-primary-voltage = the primary voltage
diag-what-rectifier = `silicon` or the rectifier valve's position
diag-what-rectifier-drop = the rectifier drop
diag-what-set-label = a label such as "as found"
diag-what-mains-voltage = the mains voltage
diag-what-node-and-voltage = a node name and its voltage
diag-what-node-voltage = the node voltage
diag-what-control-position = the control's position
diag-what-heater-voltage = the heater voltage
diag-what-a-heater-voltage = a heater voltage
diag-what-heater-nominal = the heater nominal voltage
diag-what-valve-position = a valve position
diag-what-valve-current = a valve current
diag-what-plate-voltage = the plate voltage
diag-what-screen-voltage = the screen voltage
diag-what-cathode-voltage = the cathode voltage
diag-what-sense-voltage = the voltage across the sense resistor
diag-what-primary-drop = the drop across the half primary
diag-what-description = a description
diag-what-reading = the reading
diag-what-cord-resistance = the cord resistance
diag-what-safety-test = the safety test's name
diag-what-bench-test = the bench test's name
diag-what-part-reference = a part reference
diag-what-photo-path = the photo's path
diag-what-power-rating = a power rating
diag-what-tolerance = a tolerance
diag-unusually-high = { $value } is unusually high for a valve amplifier
diag-part-example = for example: part C10 was="…" now="…"   or   part what="mains cord" was="two-wire" now="three-wire"
diag-second-network-help = write a second network under a mod of its own
diag-no-over-range = `{ $name }` takes no over-range reading (">…")
diag-no-over-range-label = only the insulation test reads "more than"
diag-no-over-range-help = write the figure the meter showed, for example: { $example }
diag-over-range-not-resistance = the over-range reading ">{ $rest }" is not a resistance
diag-over-range-expected = expected ">500M"
diag-over-range-help = write the meter's top figure after `>`, for example ">500M"
diag-key-missing = `{ $key }` missing
diag-safety-default-help = for example: { $example }; or set a default `{ $key }` in the shop profile's `safety` block
diag-unknown-bench-test = unknown bench test `{ $name }` to accept
diag-not-a-bench-test = not a bench test with a limit
diag-empty-reason-help = say why the figure is acceptable, for example "factory design"
diag-acceptance-who-help = write `by="…"` here or on `accepted`, or give the job a `technician=`
diag-acceptance-when-help = write `date="YYYY-MM-DD"` here or on `accepted`, or give the job a `completed=` date
diag-setting-range = `{ $name }` must be between 0% and 200%
diag-bias-bands-order = `fixed-bias-low` is above `fixed-bias-high`
diag-these-settings = these settings
diag-one-comes-from = one of the two comes from { $source }
diag-from-shop-profile = the shop profile
diag-from-defaults = the defaults
diag-decibel-range = `{ $name }` must be between 0 dB and 150 dB
diag-decibels = `{ $name }` must be a level in decibels
diag-expected-decibels = expected decibels
diag-decibels-help = write it as "60dB" or 60
diag-mains-range-help = mains voltages run from a few volts on a variable autotransformer to the 1000 V top of low-voltage supply (IEC 60038)

## Diagnostics of names that point nowhere (src/job/validate.rs). `what`
## is one of the `diag-ref-…` phrases; `kind` is set, channel, position,
## node, part, heater or safety.

diag-check-spelling = check the spelling against the names declared in the job
diag-list-valves-first = list the valves in a `valves` block first
diag-names-unknown-position = { $what } names valve position { $name }, which the `valves` block does not list
diag-no-such-position = no such valve position
diag-declare-in-circuit = declare it in the circuit block: node B+1 chart="350V"
diag-names-unknown-node = { $what } names node { $name }, which is neither declared in `circuit` nor measured
diag-no-such-node = no such node
diag-ref-cathode-resistor = cathode resistor { $name }
diag-ref-sense-resistor = a sense resistor
diag-ref-screen-resistor = a screen resistor
diag-ref-half-primary = a half-primary resistance
diag-ref-rectifier = the rectifier
diag-ref-readings = the "{ $set }" readings
diag-ref-warm-up = the "{ $set }" warm-up
diag-ref-mod-figure = a mod's figure
diag-ref-network-source = a network's source
diag-ref-dropper = dropper { $name }
diag-ref-filter-capacitor = filter capacitor { $name }
diag-accept-none = the job has no { $kind ->
        [set] measurement set
        [channel] bench channel
        [position] valve position
        [node] node
        [heater] heater label
        [safety] safety test
       *[part] part
    } to accept
diag-accept-unknown = the acceptance names { $kind ->
        [set] measurement set
        [channel] bench channel
        [position] valve position
        [node] node
        [heater] heater label
        [safety] safety test
       *[part] part
    } { $name }, which the job does not have
diag-accept-no-such = no such { $kind ->
        [set] measurement set
        [channel] bench channel
        [position] valve position
        [node] node
        [heater] heater label
        [safety] safety test
       *[part] part
    }

## Diagnostics of a translation file (src/catalogue/check.rs), said in the
## language the shop profile names when it is built in, else English.
## `english` is the English message, quoted as it is.

diag-ftl-syntax = this is not Fluent syntax: { $problem }
diag-ftl-syntax-help = a message is written `key = text`; a continuation line starts with spaces; an argument is written `{"{"} $name {"}"}`
diag-ftl-unknown-key = the English catalogue has no message `{ $key }`
diag-ftl-unknown-key-label = not a message of the program
diag-ftl-no-text = the message `{ $key }` has no text
diag-ftl-no-text-label = expected `key = text`
diag-ftl-unknown-argument = the message `{ $key }` uses `{ $argument }`, which the program never gives it
diag-ftl-unknown-argument-label = unknown argument
diag-ftl-no-arguments = this message takes no arguments
diag-ftl-given = it is given { $arguments }
diag-ftl-unknown-reference = the message `{ $key }` refers to `{ $reference }`, which this file does not define
diag-ftl-unknown-message = unknown message
diag-ftl-notice-incomplete = the mains-safety notice is translated only as a whole; missing: { $keys }
diag-ftl-in-this-file = in this file
diag-ftl-notice-help = translate every part of the notice (the keys starting `notice-`), or use a language the program has built in
diag-ftl-add-key-english = add `{ $key } = …`; the English is at messages/en.ftl:{ $line }: { $english }
diag-ftl-add-key = add `{ $key } = …`
diag-ftl-missing-key = the translation has no message `{ $key }`
diag-ftl-unreadable = the translation could not be read

## Diagnostics of the shop's logo (src/shop/logo.rs). `why` is one of the
## `diag-logo-…` reasons below that start with a verb.

diag-expected-in-profile-folder = expected a file name in the profile's folder
diag-logo-outside = the logo `{ $path }` is not inside the profile's folder
diag-logo-keep-inside = put the logo beside shop.kdl (or in a folder below it) and name it relative to it, for example logo "logo.svg"
diag-logo-link = the logo `{ $path }` leads outside the profile's folder (to { $target })
diag-logo-copy = copy the logo into the profile's folder instead of linking to it
diag-logo-not-file = the logo { $path } is not a regular file
diag-logo-png-svg = the logo must be a PNG or SVG file
diag-logo-too-large = the logo { $path } is { $size } bytes; the limit is { $limit }
diag-logo-smaller = a logo for a page header needs far less: export it smaller
diag-logo-cannot-read = cannot read the logo { $path }: { $error }
diag-logo-in-folder = the logo must be a PNG or SVG file in the profile's folder
diag-logo-refused = the logo { $path } { $why }
diag-logo-self-contained = the logo must be a PNG picture or a self-contained SVG drawing
diag-logo-not-png-or-text = is neither a PNG picture nor SVG text
diag-logo-not-png-or-svg = is neither a PNG picture nor an SVG drawing
diag-logo-png-undecodable = starts like a PNG picture but does not decode ({ $error })
diag-logo-svg-malformed = is not a well-formed SVG drawing ({ $error })
diag-logo-svg-root = is XML whose root is <{ $root }>, not an SVG drawing's <svg>
diag-logo-svg-refers = refers to another file or address (`{ $value }` on <{ $element }>); a logo must be self-contained
diag-logo-svg-style = has a style sheet that loads from elsewhere; a logo must be self-contained

## Diagnostics of reading a translation file (src/shop/translation.rs),
## at the profile's `language` line.

diag-translation-ftl = the translation must be a Fluent (.ftl) file in the profile's folder
diag-translation-utf8-ftl = the translation must be a UTF-8 Fluent (.ftl) file in the profile's folder
diag-translation-outside = the translation file `{ $path }` is not inside the profile's folder
diag-translation-keep-inside = put the translation beside shop.kdl (or in a folder below it) and name it relative to it, for example file="de.ftl"
diag-translation-link = the translation file `{ $path }` leads outside the profile's folder (to { $target })
diag-translation-copy = copy the translation into the profile's folder instead of linking to it
diag-translation-not-file = the translation file { $path } is not a regular file
diag-translation-too-large = the translation file { $path } is larger than { $limit } MiB; a translation is far smaller, so this is probably the wrong file
diag-translation-cannot-read = cannot read the translation file { $path }: { $error }
diag-translation-not-utf8 = { $place }: the translation file is not UTF-8 text (byte { $byte } here); save it as UTF-8

## Diagnostics of the shop profile's values, a job-number pattern, an
## unknown valve type and a photo that does not decode
## (src/shop/decode.rs, src/job/numbering.rs, src/job/valve_types.rs,
## src/photo/mod.rs). `diag-pattern-…` complete `diag-bad-pattern`;
## `diag-photo-…` below complete `diag-photo-undecodable`.

diag-what-logo-name = the logo's file name
diag-what-job-number-pattern = the job-number pattern
diag-what-language = the language
diag-what-shop-format = the shop-profile format version
diag-what-shop-name = the shop's name
diag-what-paper-size = the paper size
diag-what-warranty-text = the warranty's text
diag-pattern-not-closed = a `{"{"}` is not closed with `{"}"}`
diag-pattern-not-opened = a `{"}"}` has no `{"{"}` before it
diag-pattern-unknown-piece = `{ $piece }` is not a piece of a job number; use {"{"}yyyy{"}"}, {"{"}yy{"}"}, {"{"}mm{"}"}, {"{"}dd{"}"}, {"{"}yymm{"}"} and one {"{"}nnn{"}"}
diag-pattern-slash = a job number may not hold a slash or a control character (it names the job's file)
diag-pattern-one-count = a job number needs exactly one count, such as {"{"}nnn{"}"}; this pattern has { $count }
diag-valve-type-help = see `ampreport tubes` for the known types, or add it with a shop ratings file (--ratings FILE)
diag-valve-type-did-you-mean = did you mean { $names }? (`ampreport tubes` lists every type; a shop ratings file can add one)
diag-photo-too-large-to-decode = is too large a picture to decode (at most { $side } pixels a side and { $megabytes } MB of pixels)
diag-photo-does-not-decode = does not decode as a picture ({ $error })
diag-photo-not-encoded = could not be encoded again ({ $error })

## What the image reader found wrong with a photo or a PNG logo
## (src/photo/mod.rs, `image_problem`), the `$error` of
## `diag-photo-does-not-decode` and `diag-logo-png-undecodable`.
## `$detail` is the reader's own words.

diag-image-damaged = its data is damaged or cut short ({ $detail })
diag-image-not-encoded = it could not be written again ({ $detail })
diag-image-too-large = it is larger than the reader's limits allow
diag-image-unsupported = it uses a kind of picture the reader does not support ({ $detail })

## What the XML reader found wrong with an SVG logo (src/shop/logo.rs,
## `xml_problem`), the `$error` of `diag-logo-svg-malformed`.

diag-xml-at = { $what } (line { $line }, column { $column })
diag-xml-ends-early = it ends before the drawing is complete
diag-xml-no-root = it holds no element
diag-xml-dtd = it has a document type declaration, which is not allowed
diag-xml-wrong-close = `</{ $found }>` closes an element that is `<{ $expected }>`
diag-xml-unknown-entity = the entity `&{ $name };` is not defined
diag-xml-duplicate-attribute = the attribute `{ $name }` is given twice
diag-xml-unknown-namespace = the namespace prefix `{ $name }` is not declared
diag-xml-bad-name = a name that XML does not allow
diag-xml-bad-attribute = an attribute value that XML does not allow
diag-xml-too-many = it has more elements, attributes or namespaces than a logo may

## Examples in diagnostics whose sample words are the reader's own: KDL as
## it would be written, with its texts in the shop's language
## (src/job/decode.rs, src/shop/decode.rs). The node and property names
## stay as they are.

diag-rectifier-example = rectifier V5   or   rectifier silicon
diag-shop-example = shop "Your shop's name" {"{"} address "…"; contact "…" {"}"}
diag-warranty-example = warranty "Work and parts fitted are guaranteed…" period="90 days"
diag-accept-example-valve = valve V3 check=screen-voltage reason="factory design"
diag-accept-example-node = node B+1 reason="…"
diag-accept-example-part = part C10 reason="…"
diag-accept-example-heater = heater reason="…"
diag-accept-example-safety = safety leakage reason="…"
diag-accept-example-bench = bench output-power channel="left" reason="…"

## The terminal's other messages: what the commands say besides a job's
## summary (src/cli), in the job's shop-profile language once it is read;
## a batch's closing summary in the language all its jobs share, else
## English. `time` is already written ("1.24 s").

cli-rendered = rendered { $job } → { $output } in { $time }
cli-unchanged = unchanged { $output }
cli-failed = failed { $job }: { $error }
cli-see-above = see above
cli-no-message = no message
cli-summary = { $jobs ->
        [one] 1 job
       *[other] { $jobs } jobs
    } in { $time }: { $rendered } rendered, { $unchanged } unchanged, { $failed } failed
cli-summary-stopped = , { $count } not started (stopped)
# The word after the progress bar's count ("3/8 jobs"), in the language
# the jobs finished so far share.
cli-progress-jobs = jobs
cli-watch-failed = failed { $job } after { $time }; { $output } was left as it was
cli-wrote = wrote { $path }
cli-wrote-stdout = wrote the PDF to standard output
cli-up-to-date = { $path } is up to date (--force renders it anyway)
cli-shop-templates-failed = note: the document from the shop templates in { $folder } failed; the templates are at fault, not the job
cli-built-in-template-failed = note: the built-in template failed; this is a fault in ampreport, please report it
cli-left-as-it-was = note: { $path } was left as it was
cli-undrawable = warning: { $place }: the text of { $field } holds characters the document's fonts cannot draw ({ $chars }); they print as { $placeholder }
cli-field-of = `{ $key }` of `{ $node }`
cli-cannot-make-folder = error: could not make the folder { $folder } for the PDF: { $error }
cli-listing-name-clash = error: the listing's PDF { $path } would be written over by its own Markdown; name the PDF with .pdf
cli-cannot-write-source = error: could not write the generated source to { $folder }: { $error }
cli-wrote-source = wrote the generated source to { $folder }
cli-same-pdf-from = the same PDF comes from: { $command }
cli-typst-warned =
    typst warned:
    { $warnings }
cli-cannot-record = warning: could not record what { $path } was made from ({ $error }); the next run renders it again

## `ampreport compare` (src/report/compare.rs, src/cli/compare.rs): the
## table of changed figures, in the language of the job's shop profile
## (two versions: the language both share, else English). `$known` is a
## list of set labels, each in quotation marks; `$side` names a version.

cli-compare-no-such-set = error: { $job } has no measurement set “{ $label }”; it has { $known }
cli-compare-no-such-set-none = error: { $job } has no measurement set “{ $label }”; it has none
cli-compare-path-from-here = note: in REV:PATH, git reads PATH from the top folder of the repository; for the file named from this folder, write { $spelling }
cli-compare-set-name = “{ $label }”
cli-compare-set-only-in = set “{ $label }” only in { $side }
cli-compare-nothing-changed = no figure changed
cli-compare-changed = { $count ->
        [one] 1 figure changed
       *[other] { $count } figures changed
    }
cli-compare-col-set = set
cli-compare-col-what = what
cli-compare-col-figure = figure
cli-compare-col-old = old
cli-compare-col-new = new
cli-compare-col-change = change
cli-compare-safety = safety
cli-compare-mains = mains
cli-compare-figure-plate-volts = plate
cli-compare-figure-screen-volts = screen
cli-compare-figure-cathode-volts = cathode
cli-compare-figure-grid-volts = grid
cli-compare-figure-cathode-current-ma = cathode current
cli-compare-figure-plate-current-ma = plate current
cli-compare-figure-screen-current-ma = screen current
cli-compare-figure-plate-dissipation-w = plate dissipation
cli-compare-figure-plate-dissipation-pct = plate dissipation %
cli-compare-figure-high-line-plate-dissipation-pct = high line plate dissipation %
cli-compare-figure-screen-dissipation-w = screen dissipation
cli-compare-figure-screen-dissipation-pct = screen dissipation %
cli-compare-figure-status = status
cli-compare-figure-measured-volts = measured
cli-compare-figure-corrected-volts = corrected
cli-compare-figure-deviation-pct = deviation %
cli-compare-figure-high-line-volts = high line
cli-compare-figure-voltage-volts = voltage
cli-compare-figure-current-ma = current
cli-compare-figure-power-w = power
cli-compare-figure-power-pct = power %
cli-compare-figure-high-line-power-pct = high line power %
cli-compare-figure-highest-volts = highest
cli-compare-figure-margin-pct = margin %
cli-compare-figure-mains-volts = mains
cli-compare-figure-measured-value = measured

## `ampreport init` and `ampreport new` (src/cli/init.rs, src/cli/new.rs).
## `init` reads no shop profile and speaks English; `new` speaks the
## language of the profile it numbers the job by. `$next` is one of the
## `-next-` messages; `cli-new-started-from` and `cli-new-readings` become
## comment lines at the top and the end of the new job file, one for each
## line of the message.

cli-init-wrote = wrote { $path }; { $next }
cli-init-exists = error: { $path } already exists; ampreport never replaces a file
cli-init-cannot-write = error: cannot write { $path }: { $error }
cli-init-cannot-make-folder = error: cannot make the folder { $folder }: { $error }
cli-init-next-job = fill it in, then run `ampreport check { $path }`
cli-init-next-shop = fill it in; jobs in its folder and below use it (see docs/shop.md)
cli-init-next-gitattributes = PDFs and photos are binary to git, job files are text
cli-init-next-gitignore = rendered documents stay out of git; see docs/git.md
cli-new-next = fill in the readings, then run `ampreport check { $path }`
cli-new-fault = note: the new job file could not be made; this is a fault in ampreport, please report it
cli-new-not-a-folder = error: { $folder } is not a folder
cli-new-started-from =
    Started from { $file } (job { $id }) with `ampreport new --from`: the unit, the mains,
    the line-up and the circuit are carried over; the readings, parts, mods,
    safety tests, notes, customer and charges are not.
cli-new-readings = Readings of this service:

## The comments of the job skeleton `init` and `new` write
## (templates/job-skeleton.kdl, where each `// @KEY` line stands for one
## message): each line of a message becomes one comment line, so keep
## lines short (under 80 characters with the indentation).

cli-skeleton-intro = An ampreport job file (KDL 2.0). One file per repair; keep it under
    version control and regenerate the documents from it.
cli-skeleton-values = Values: a plain number is in the base SI unit (volts, amperes, ohms,
    watts, farads, hertz). Text values may carry an SI prefix or an RKM code
    and a unit symbol: "470k", "4k7", "4R7", "0.022u", "38.5mV", "34mA",
    "22µF". The symbol must match the field: "38.5mA" where a voltage
    belongs is an error. Percentages: "10%" or 10. Dates: "YYYY-MM-DD".
    Text in double quotes; booleans are #true and #false.
cli-skeleton-format = The format this file is written in. Always first.
cli-skeleton-job = The job: id (required), dates received and completed, technician.
cli-skeleton-customer = The customer (optional; left out of dealer listings).
cli-skeleton-unit = The unit: make and model (required), serial, year; description and
    condition as child nodes.
    rated-power is the maker's rated output, for the bench tests.
cli-skeleton-mains = Mains: local nominal voltage (required) and frequency; the supply
    tolerance used for the high-line projection (default +5 % for a
    100–130 V nominal, per ANSI C84.1 Range A, else +10 %, per IEC 60038);
    and the design mains that the unit's factory voltage chart assumes.
cli-skeleton-valves = The valve line-up: position, type (as the ratings table knows it; see
    `ampreport tubes`) and role: preamp, phase-inverter, output, rectifier,
    tremolo, reverb-driver, reverb-recovery or other.
cli-skeleton-circuit = Circuit facts the calculations need.
cli-skeleton-bias = cathode or fixed
cli-skeleton-cathode-resistor = A cathode resistor, possibly shared by a pair:
cli-skeleton-sense-resistor = A sense resistor from a cathode to ground, for bias checks:
cli-skeleton-screen-resistor = A screen resistor and the node feeding it (gives the screen current):
cli-skeleton-half-primary = DC resistance of a half primary (measured cold, power off), for the
    transformer-resistance method; list both valves of a parallel pair:
cli-skeleton-nodes = Supply nodes with the factory chart figure and its tolerance:
cli-skeleton-droppers = Dropper resistors between two nodes, with their power rating:
cli-skeleton-filter-capacitors = Filter capacitors on a node, with their voltage rating:
cli-skeleton-winding = The high-voltage winding: RMS volts per side and the primary
    voltage that figure is rated at (gives the cold-start peak):
cli-skeleton-rectifier = The rectifier: a valve position, or `silicon` (drop="1V" optional).
cli-skeleton-measurements = One or more measurement sets, each with the mains read at the time.
cli-skeleton-node-reading = A node: name and the voltage read (chart= and tolerance= may
    override the circuit's figure for this reading).
cli-skeleton-valve-reading = A valve: plate, screen, cathode and grid voltages to ground; the
    voltage across its sense resistor (sense=) or across its half
    primary (primary-drop=); or a current read directly with
    method=probe (bias probe: cathode current) or method=shunt (ammeter
    across half the primary: plate current).
cli-skeleton-final-set = The last set (or the one marked final=#true) is the state the unit is
    handed over in: the summary, the at-a-glance panel and --strict judge it.
cli-skeleton-bias-control = Where the bias control was left, in your words:
cli-skeleton-type-change = Another valve type fitted for this set (a rectifier swapped):
cli-skeleton-set-circuit = Parts that differ from the circuit block for this set:
cli-skeleton-output-power = Bench tests into a dummy load. Output power: the reading as rms= or
    peak-to-peak=, and at=clipping, a distortion (at="5%") or the input
    drive (at="0.5V"); frequency defaults to 1 kHz.
cli-skeleton-hum-noise = Hum and noise: RMS volts across the load, input shorted or open.
cli-skeleton-gain = Gain: input volts for an output reading.
cli-skeleton-response = Response: output at each frequency for a fixed input; one reading
    must be at the reference (default 1 kHz).
cli-skeleton-suggest = For a cathode-biased amplifier, ask for a cathode-resistor
    suggestion (it appears by itself when a valve runs above the guide):
cli-skeleton-warm-up = Readings while the amplifier warms up, by time since power-on:
cli-skeleton-part-without-reference = A part without a circuit reference:
cli-skeleton-mods = A mod may carry a network: the circuit it changes as it was, then the
    edits that make it as left. The document plots its response before and
    after at each pot setting (0-10; several settings, "3 7", give a curve
    each). `ground` is the reference node. See docs/job-format.md.
cli-skeleton-safety = Safety tests with the limit applied. Set the limits from the rules that
    apply where you work; these are common defaults.
cli-skeleton-private = A note (or a part, a mod, the findings, the work) marked private is
    left out of the listing document (render --listing):
cli-skeleton-photos = Photos, relative to this file's folder (PNG or JPEG, at most 20 MB); the
    hand-over shows them all, the listing those marked listing=#true:
cli-skeleton-accepted = Findings you have judged and accept as they are, each with its reason
    (by= and date= default to the job's technician and completion date):
cli-skeleton-settings = Guide bands and margins; the defaults (common practice) are shown.

## The terminal summary's words added with the bias column
## (src/report/terminal.rs): the kind of bias of a valve.

term-bias-cathode = cathode
term-bias-fixed = fixed

## What went wrong between a finished document source and a PDF: typst's
## failures and the typesetting folder's (src/typeset/error.rs, locate.rs,
## compile.rs, child.rs, sandbox.rs). A failure found before the shop
## profile is read (typst missing or too old) is said in English.
## `$install` is the install command, `$said` empty or `cli-typst-it-said`,
## `$status` one of the `cli-program-…` messages; `$why` of
## `cli-typst-incomplete` one of the `cli-typst-pdf-…` reasons, whose
## `$detail` is the PDF reader's (lopdf's) own words.

cli-typst-not-found = typst was not found: { $looked }
cli-typst-not-found-help = install it with `{ $install }`, or name the program with `--typst PATH` or the AMPREPORT_TYPST environment variable
cli-typst-looked-path = no `{ $program }` on PATH
cli-typst-looked-path-given = no `{ $path }` on PATH ({ $origin })
cli-typst-looked-missing = { $path } does not exist ({ $origin })
cli-typst-looked-not-executable = { $path } is not an executable file ({ $origin })
cli-typst-origin-option = the path given with --typst
cli-typst-origin-env = the path in AMPREPORT_TYPST
cli-typst-too-old = { $path } is typst { $found }, but ampreport needs typst { $needed } or newer
cli-typst-too-old-help = upgrade it with `{ $install }`, or point `--typst PATH` at a newer one
cli-typst-unusable = could not run { $path } as typst: { $problem }
cli-typst-unusable-help = check that this is the typst command-line program and that it runs; a fresh one comes from `{ $install }`
cli-typst-failed-to-start = it failed to start ({ $error })
cli-typst-version-unreadable = its `--version` answer could not be read ({ $error })
cli-typst-version-odd = `--version` { $status } and printed { $said }, not `typst X.Y.Z`
cli-typst-compile-failed =
    typst could not compile the document (it { $status }):
    { $diagnostics }
cli-typst-compile-failed-help = the generated source was kept for inspection in { $kept }; file names in the messages above are relative to that folder
cli-typst-misbehaved = the typst program { $path } { $what }{ $said }
cli-typst-misbehaved-help = this points at the typst program or the machine it runs on (memory, disk), not at the job: try the same typst on the kept source in { $kept }, or install a fresh one with `{ $install }`
cli-typst-it-said =
    ; it said:
    { $diagnostics }
cli-typst-no-messages = { $status } and printed no messages
cli-typst-crashed = { $status }, which is how a Rust program reports a crash
cli-typst-odd-status = { $status }, which typst does not use for a document error
cli-typst-no-file = reported success but wrote no file
cli-typst-too-big = reported success but wrote { $size } bytes, more than the { $limit } a document may have
cli-typst-incomplete = reported success but wrote an incomplete file: { $why }
cli-typst-pdf-empty = it is empty
cli-typst-pdf-not-pdf = it does not start like a PDF (`%PDF-`)
cli-typst-pdf-no-end = it stops after { $size } bytes without the end-of-file mark `%%EOF`
cli-typst-pdf-unparsable = it does not parse as a PDF ({ $detail })
cli-typst-pdf-no-pages = it has no pages
cli-typst-pdf-misplaced = its object { $object } is not at byte { $offset }, where its cross-reference table puts it
cli-typst-pdf-reader-stopped = the PDF reader broke off while reading it
cli-typst-timed-out = the typst program { $path } did not finish `{ $action }` within { $seconds } s and was stopped{ $said }
cli-typst-timed-out-help = a hand-over document takes a few seconds; a typst that hangs is at fault, or the machine is very busy. Allow longer with `--timeout SECONDS` or AMPREPORT_TIMEOUT
cli-typst-interrupted = stopped by { $signal }; typst was stopped and the temporary files removed
cli-typst-signal-named = { $name } (signal { $number })
cli-typst-signal = signal { $number }
cli-typst-missing-text = the finished document does not show { $what }: { $missing } { $count ->
        [one] is
       *[other] are
    } missing from its text
cli-typst-missing-text-help = the template must place { $what } where it can be read; the generated source was kept in { $kept }
cli-typst-notice = the mains-safety notice and the deferral to local electrical codes
cli-typst-bad-sandbox-path = `{ $path }` cannot be placed in the typesetting folder: { $reason }
cli-typst-bad-sandbox-path-help = use a plain relative path such as `plots/anode.svg`
cli-typst-path-not-in-sandbox = it is not one of the sandbox files
cli-typst-path-empty = the path is empty
cli-typst-path-not-relative = the path must be relative
cli-typst-path-backslash = use `/` between folder names
cli-typst-path-control = the path holds a control character
cli-typst-path-dots = the path has an empty, `.` or `..` part
cli-typst-path-fonts = the `fonts/` folder is reserved for the bundled fonts
cli-typst-io-create-folder = could not create a folder in { $path }
cli-typst-io-write-files = could not write the typesetting files to { $path }
cli-typst-io-write-fonts = could not write the fonts to { $path }
cli-typst-io-wait = could not wait for typst compiling { $path }
cli-typst-io-read-pdf = could not read the PDF typst wrote to { $path }
cli-typst-io-write-stdout = could not write the PDF to standard output
cli-typst-io-create-temporary = could not create a temporary file in { $path }
cli-typst-io-write = could not write { $path }
cli-program-exited = exited with status { $code }
cli-program-killed-named = was killed by signal { $signal } ({ $name })
cli-program-killed = was killed by signal { $signal }
cli-program-ended = ended with { $status }
cli-program-more-output = … { $bytes } more bytes of output not shown

## A mod's network in words (src/calc/network/mod.rs): its source, its
## edits and why it could not be worked out, as the document and
## `calc --json` give them. `$how` is `figure-network-bypassed` or
## `-unbypassed`; `$kind` one of the `figure-network-kind-…` words.

figure-network-ideal-source = an ideal voltage source (no output impedance)
figure-network-source-impedance = a source of { $impedance } output impedance
figure-network-valve-source = { $position } ({ $type }, μ { $mu }, ra { $ra }) with a { $load } plate load{ $how } = { $impedance } output impedance
figure-network-bypassed = : ra ∥ RL
figure-network-unbypassed = , cathode resistor { $resistor } unbypassed: (ra + (μ + 1)·Rk) ∥ RL
figure-network-not-in-line-up = valve position { $position } is not in the line-up
figure-network-not-in-ratings = { $type } is not in the ratings table
figure-network-no-mu-ra = { $position } ({ $type }) has no typical μ and ra in the ratings table
figure-network-singular = the network's equations are singular at { $frequency } Hz: some node is left without a path to ground at that frequency
figure-network-set-to = set to { $settings }
figure-network-taper-linear = linear taper
figure-network-taper-audio = audio taper
figure-network-removed-value = { $reference } ({ $value }) removed
figure-network-removed = { $reference } removed
figure-network-added-link = { $reference } added: a link from { $from } to { $to }
figure-network-added = { $reference } added: { $kind } { $value } between { $nodes }
figure-network-source-changed = the source changed
figure-network-load-now = the load is now { $load } at { $node }
figure-network-unloaded = the load is now unloaded at { $node }
figure-network-kind-resistor = resistor
figure-network-kind-capacitor = capacitor
figure-network-kind-inductor = inductor
figure-network-kind-link = link
figure-network-kind-pot = pot

## What `check`, `render` and `watch` say before any shop profile is read,
## or about no one job (src/cli/check.rs, render.rs, watch.rs, batch.rs,
## src/typeset/locate.rs): always in English, from here all the same.
## `$error` is a message from elsewhere, already written.

cli-error = error: { $error }
cli-warning = warning: { $warning }
cli-no-job-files = error: no job files (*.kdl) in { $folders }
cli-no-job-files-here = error: no job files (*.kdl) in { $folders } (--recursive also searches their sub-folders)
cli-no-stop-signals = warning: stop signals will end ampreport without clean-up: { $error }
cli-output-one-job = error: -o names the PDF of one job file; for several jobs or a folder use --out-dir DIR
cli-emit-source-one-job = error: --emit-source writes the source of one job; name one job file
cli-stdin-one-job = error: `-` reads one job from standard input; it cannot be named beside other jobs
cli-outputs-clash = error: { $first } and { $second } would both be written to { $output }; use --out-dir DIR or rename one
cli-no-run-key = warning: { $error }; every job is rendered
cli-stdout-is-terminal = error: `-o -` writes the PDF to standard output, which is a terminal here; send it to a file or a program (`-o - > job.pdf`, `-o - | lpr`)
cli-listing-needs-file = error: the listing is a PDF and Markdown beside it, so it needs a file: name it with `-o FILE.pdf`
cli-stdin-needs-output = error: a job read from standard input has no file to put the PDF beside; name the output with `-o FILE`, or `-o -` for standard output
cli-no-template-folder = error: the template folder { $folder } does not exist or is not a folder
cli-typst-newer = { $path } is typst { $version }, newer than the tested { $series }.x series; the document may look different
cli-no-workers = error: could not start { $workers } worker threads: { $error }
cli-watch-no-stop-signals = warning: Ctrl-C will end the watch without clean-up: { $error }
cli-watch-no-stdin = error: watch needs job files to watch; `-` (standard input) cannot be watched
cli-watch-no-stdout = error: watch writes PDF files; `-o -` (standard output) cannot be used
cli-watch-cannot = error: cannot watch files on this system: { $error }
cli-watching = { $count ->
        [one] watching 1 job for changes (Ctrl-C stops)
       *[other] watching { $count } jobs for changes (Ctrl-C stops)
    }
cli-watch-stopped = stopped watching
cli-watch-trouble = warning: watching files: { $error }
cli-watcher-stopped = error: the file watcher stopped
cli-watch-folder = cannot watch { $folder }: { $error }
cli-shop-beside-job = note: using the shop profile { $used } found beside the job; --shop { $named } applies only where there is none
cli-reading-stdin = note: reading the job from standard input; end it with Ctrl-D

## A document that could not be assembled before typst ran
## (src/cli/render.rs, from src/report/handover/mod.rs), in the job's
## language. `$detail` is one of the `cli-template-…` messages below,
## `$error` the operating system's answer (`diag-os-…`) or one of the
## `cli-inside-…` refusals.

cli-template-not-filled = error: the template { $name } could not be filled: { $detail }
cli-shop-image-unreadable = error: could not read the shop image { $path }: { $error }
cli-template-file-refused = error: refused a file of the template folder: { $error }
cli-chart-failed = could not draw the { $chart ->
        [plate-dissipation] plate dissipation
        [supply-chain] supply chain
        [warm-up] warm-up
        [network-response] network response
       *[frequency-response] frequency response
    } chart: { $detail }

## What the template engine found wrong (src/typeset/template_env.rs,
## src/typeset/inside.rs, src/report/handover/mod.rs), the `$detail` of
## `cli-template-not-filled`. `cli-template-place` adds the template and
## its line to `$what`; `cli-template-engine-said` quotes the engine's own
## words (`$detail`, in English) where the error names a template line.
## `$what` of `cli-template-no-notice` is `document` or `listing`.

cli-template-place = { $what } ({ $name }, line { $line })
cli-template-engine-said = { $what }: { $detail }
cli-template-kind-syntax = a syntax error
cli-template-kind-undefined = a value the template uses is undefined
cli-template-kind-unknown-filter = a filter that does not exist
cli-template-kind-unknown-test = a test that does not exist
cli-template-kind-unknown-function = a function that does not exist
cli-template-kind-unknown-method = a method that does not exist
cli-template-kind-not-found = a template it includes or imports is not there
cli-template-kind-too-many-arguments = too many arguments
cli-template-kind-missing-argument = an argument is missing
cli-template-kind-bad-escape = a string with a bad escape sequence
cli-template-kind-invalid-operation = an operation its values do not allow
cli-template-kind-wrong-value = a value of the wrong kind
cli-template-kind-bad-include = a template it includes could not be filled
cli-template-kind-other = the template engine stopped
cli-template-autoescape = the template `{ $name }` uses `{"{"}% autoescape %{"}"}`, which Typst templates may not
cli-template-bad-name = the template name `{ $name }` is not a plain relative path
cli-template-refused = the template `{ $name }` was refused: { $why }
cli-template-not-utf8 = the template `{ $name }` is not UTF-8 text
cli-template-no-message = the message catalogue ({ $language }, { $origin }) has no message `{ $key }`
cli-template-not-rows = the filter `typst_rows` takes the rows of a table as the program gives them (`set.nodes`, `set.valves` …), not another value
cli-template-no-notice = the { $what ->
        [listing] listing
       *[document] document
    } must carry the mains-safety notice: put the line `{ $line }` in the template
cli-inside-link = { $path } is a symbolic link; only regular files inside the template folder are used (copy the file in instead of linking it)
cli-inside-not-a-file = { $path } is not a regular file
cli-inside-bad-name = `{ $name }` is not a plain relative path inside the template folder
cli-inside-cannot-read = could not read { $path }: { $error }

## Where a document may not be written (src/typeset/output.rs), in the
## job's language once its shop profile is read. `$what` is one of the
## `cli-input-…` words, `$kind` one of the `cli-kind-…` words, `$problem`
## one of the `cli-emit-folder-…` phrases.

cli-output-folder = the output { $path } names a folder, not a file
cli-output-folder-help = name the file, for example `-o { $example }`
cli-output-link = the output { $path } is a symbolic link (to { $target }); ampreport does not write through links
cli-output-link-help = name the file itself with `-o`, or remove the link
cli-output-not-a-file = the output { $path } exists and is { $kind }, not a regular file
cli-output-not-a-file-help = ampreport writes only over a regular file; name another path with `-o`
cli-output-no-folder = the folder of the output { $path } does not exist
cli-output-no-folder-help = create the folder first, or name another path with `-o`
cli-output-is-input = the output { $path } is { $what } ({ $input }); writing there would destroy it
cli-output-is-input-help = name another path with `-o`
cli-output-inside-input = the output { $path } is inside { $what } ({ $input })
cli-output-inside-input-help = ampreport reads every file in that folder; write the output somewhere else with `-o`
cli-emit-folder = the source folder { $path } { $problem }
cli-emit-folder-link = is a symbolic link; ampreport does not write through links
cli-emit-folder-link-help = name the folder itself, or remove the link
cli-emit-folder-not-a-folder = exists and is { $kind }, not a folder
cli-emit-folder-new-help = name a new or empty folder
cli-emit-folder-not-empty = is not empty
cli-emit-folder-not-empty-help = name a new or empty folder, or add --force to replace everything in it
cli-emit-folder-too-wide = is the root, home or current folder, or holds the current folder
cli-emit-folder-too-wide-help = name a folder of its own for the source, such as `./handover-source`
cli-emit-folder-overlaps = overlaps { $what } ({ $path })
cli-emit-folder-overlaps-help = name a folder of its own for the source, apart from the job, its inputs and the PDF
cli-input-job-file = the job file
cli-input-job-of-run = a job file of this run
cli-input-ratings-file = a ratings file
cli-input-shop-profile = the shop profile
cli-input-photo = a photo of the job
cli-input-template-folder = the template folder
cli-input-logo = the shop's logo
cli-input-translation = the shop's translation file
cli-input-typst = the typst program
cli-input-pdf-output = the PDF output
cli-kind-fifo = a FIFO (named pipe)
cli-kind-device = a device
cli-kind-socket = a socket
cli-kind-folder = a folder
cli-kind-link = a symbolic link
cli-kind-other = not a regular file

## A job file that cannot be read at all (src/input_file.rs, said by
## src/cli/load.rs): in the language of the shop profile that serves the
## job's folder, English without one. `$place` is `file:line:column`,
## `$byte` the byte in hexadecimal (0x9f), `$error` the operating
## system's own words.

cli-job-file-cannot-read = error: cannot read the job file { $path }: { $error }
cli-job-file-too-large = error: the job file { $path } is larger than { $limit } MiB; a job or ratings file is a few kilobytes, so this is probably the wrong file
cli-job-file-not-utf8 = error: { $place }: the job file is not UTF-8 text (byte { $byte } here); save it as UTF-8

## The `--verbose` lines saying what was read from where (src/cli/ui.rs,
## load.rs, said.rs, render.rs): `cli-read` with `$what` one of the
## `cli-read-what-…` words and `$from` one of the `cli-read-from-…`
## phrases. Lines about a job follow its shop profile's language (the
## profile's own line the language the profile names); lines said before
## any profile is read (the folders, the ratings, the templates, typst)
## are English. `$bytes` and `$count` are already written.

cli-read = read: { $what }: { $from }
cli-read-what-config-folder = config folder
cli-read-what-cache-folder = cache folder
cli-read-what-ratings = ratings
cli-read-what-shop = shop profile
cli-read-what-logo = shop logo
cli-read-what-translation = translation
cli-read-what-job = job
cli-read-what-template = template
cli-read-what-typst = typst
cli-read-what-fonts = fonts
cli-read-what-photo-cache = photo cache
cli-read-from-path = { $path }
cli-read-from-no-home = none (no home folder in the environment)
cli-read-from-ratings-built-in = built in ({ $count } types, embedded in the program)
cli-read-from-ratings-file = { $path } (a shop's ratings file)
cli-read-from-shop-refused = none (--no-shop)
cli-read-from-shop-none = none (no { $file } beside the job or above it, no --shop, none in the config folder)
cli-read-from-shop = { $path } ({ $how ->
        [beside] beside the job or above it
        [named] named with --shop
       *[config] the config folder
    })
cli-read-from-job = { $path } ({ $bytes } bytes)
cli-read-from-stdin = standard input ({ $bytes } bytes)
cli-read-from-template-shop = { $path } (shop folder)
cli-read-from-template-built-in = { $name } (built in, embedded in the program)
cli-read-from-typst = { $path } (version { $version })
cli-read-from-fonts-cache = { $path } (cache)
cli-read-from-fonts-sandbox = embedded in the program, written for this run (no usable cache folder)

## The operating system's answer to a file operation that failed
## (src/catalogue/mod.rs, `os_error`), quoted inside other messages as
## their `$error`. `$detail` is the system's (or the reader's) own words.

diag-os-not-found = there is no such file or folder
diag-os-permission-denied = permission denied
diag-os-is-a-folder = it is a folder, not a file
diag-os-not-a-folder = a part of the path is not a folder
diag-os-too-large = the file is too large for the file system
diag-os-already-exists = it already exists
diag-os-disk-full = the disk is full
diag-os-read-only = the file system is read-only
diag-os-ended-early = it ended too early
diag-os-interrupted = the operation was interrupted
diag-os-timed-out = the operation timed out
diag-os-broken-pipe = the other end of the pipe was closed
diag-os-out-of-memory = there is not enough memory
diag-os-invalid-data = the data is not valid ({ $detail })
diag-os-other = { $detail }

## Reading `REV:PATH` through git for `compare` (src/git/mod.rs), in the
## language of the shop profile serving PATH's folder. `$rev` and `$path`
## are the two halves of `$spec`; `$detail` is git's own words, quoted.

cli-git-missing = the `git` command is needed to read { $spec }, and it could not be run: { $error }
cli-git-not-repository = cannot read { $spec }: this folder is not inside a git repository (git said: “{ $detail }”)
cli-git-no-revision = cannot read { $spec }: the repository has no revision `{ $rev }` (git said: “{ $detail }”)
cli-git-not-in-revision = cannot read { $spec }: `{ $path }` is not in revision `{ $rev }` (git said: “{ $detail }”)
cli-git-failed = git could not read { $spec }: { $detail }
cli-git-timed-out = git took more than { $seconds } seconds to read { $spec }
cli-git-interrupted = stopped by signal { $signal } while git read { $spec }
cli-git-too-large = { $spec } is larger than { $limit } MiB; a job file is a few kilobytes
cli-git-not-utf8 = { $spec } is not UTF-8 text
