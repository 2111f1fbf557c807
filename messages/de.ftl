# ampreport's message catalogue: German (Deutsch).
#
# NEEDS A NATIVE SPEAKER'S REVIEW. Written with care by a non-native
# writer to prove the catalogue mechanism; the trade terms (Anode,
# Schirmgitter, Ruhestrom, Verlustleistung, Siebkondensator …) follow
# common German workshop usage as far as the writer knows it. Before a
# shop hands a German document to a customer, a German-speaking
# technician should read every message here, above all the mains-safety
# notice (`notice-…`), which must match the wording local rules expect.
#
# Same keys and arguments as messages/en.ftl (the reference); the program
# refuses a catalogue that lacks a key. Numbers keep the decimal point
# (see docs/shop.md).

date = { $day }. { $month } { $year }
month-1 = Januar
month-2 = Februar
month-3 = März
month-4 = April
month-5 = Mai
month-6 = Juni
month-7 = Juli
month-8 = August
month-9 = September
month-10 = Oktober
month-11 = November
month-12 = Dezember

## Statuswörter.

doc-footer-job = Auftrag
doc-footer-page = Seite
doc-footer-of = von
doc-footer-commit = Commit
doc-footer-edits = + Änderungen
doc-photos = Fotos
doc-footer-digest = SHA-256 der Auftragsdatei
status-ok = OK
status-caution = VORSICHT
status-over = ZU HOCH
status-cold = ZU KALT
status-accepted = AKZEPTIERT
status-unchecked = NICHT GEPRÜFT
status-unmeasured = NICHT GEMESSEN
doc-key-ok = innerhalb der Grenze
doc-key-caution = nahe an einer Grenze
doc-key-over = über einem Grenzwert
doc-key-cold = unter dem Ruhestrom-Ziel
doc-key-accepted = als annehmbar beurteilt

## Das Übergabeprotokoll (templates/handover.typ).

doc-kind = ÜBERGABEPROTOKOLL
doc-job = Auftrag { $id }
doc-received = Eingang { $date }
doc-completed = Fertig { $date }
doc-technician = Techniker: { $name }
doc-unit = Gerät
doc-serial = Seriennummer
doc-made = Baujahr { $year }
doc-condition = Zustand bei Eingang:
doc-customer = Kunde
doc-not-recorded = Nicht erfasst
doc-mains = Netz
doc-mains-line = { $nominal } Nennspannung, obere Netzgrenze { $high_line } ({ $tolerance })
doc-mains-design = ; die Spannungstabelle des Herstellers gilt für { $design }
doc-found = Befund
doc-done = Erledigt
doc-now = Jetzt
doc-glance = AUF EINEN BLICK
doc-read-notice-bold = Vor Gebrauch oder Öffnen des Geräts
doc-read-notice = bitte den Hinweis zur Netzsicherheit auf Seite
doc-read-notice-end = { " " }lesen.
doc-attention = Was Aufmerksamkeit braucht
doc-open-in = Offen in den Messwerten „{ $label }“, mit denen das Gerät übergeben wird
doc-nothing-open = In den Messwerten „{ $label }“, mit denen das Gerät übergeben wird, ist nichts offen.
doc-accepted-heading = Vom Techniker akzeptiert
doc-col-finding = Befund
doc-col-figure = Wert
doc-col-why-acceptable = Warum annehmbar
doc-col-accepted-by = Akzeptiert von
doc-accepted-note = Ein akzeptierter Wert behält in den Tabellen seinen Status und seine Zahlen; der Techniker hat ihn beurteilt und zeichnet dafür, daher zählt er nicht mehr gegen das Gerät.
doc-whole-job = Für den ganzen Auftrag
doc-history = Was die Messwerte „{ $label }“ zeigten
doc-the-job = Der Auftrag
doc-complaint = Beanstandung
doc-findings = Befund
doc-work-done = Ausgeführt
doc-parts = Ersetzte Teile
doc-col-part = Teil
doc-col-was = Vorher
doc-col-now = Jetzt
doc-col-reason = Grund
doc-col-original-kept = Original
    aufbewahrt
doc-no-parts = Es wurden keine Teile ersetzt.
doc-mods = Änderungen
doc-col-change = Änderung
doc-col-why = Warum
doc-col-reversible = Rückbaubar
doc-worked-figures = Berechnete Werte
doc-worked-note = Die berechneten Werte sind Lehrbuch-Abschätzungen erster Ordnung; für eine Röhrenstufe verwenden sie die typischen Werte μ und ra aus der Datenzeile der Röhre. Die wirkliche Schaltung weicht je nach Röhre und umgebenden Bauteilen ab.
doc-network-before-after = { $label }: Frequenzgang vor und nach der Änderung
doc-network-response = { $label }: Frequenzgang des Netzwerks
doc-network-curves = Die Kurven zeigen die Spannung dort je Volt Leerlaufspannung der Quelle, berechnet von 20 Hz bis 20 kHz.
doc-network-dashed = Grau gestrichelt: vor der Änderung; schwarz durchgezogen: danach.
doc-network-markers = Jede Potistellung hat ihr eigenes Symbol.
doc-network-problem = Das Netzwerk konnte nicht berechnet werden: { $problem }
doc-changed = Geändert
doc-col-pot-settings = Potistellungen (0–10)
doc-col-corner = Eckfrequenz oder Mittensenke
doc-row-change = Änderung
doc-row-before = vorher
doc-row-after = nachher
doc-network-method = Berechnet mit modifizierter Knotenanalyse bei 40 Punkten je Dekade. Logarithmische Potis folgen zwei Geraden durch 10 % des Widerstands bei halber Drehung (gängige Praxis). Eine Eckfrequenz liegt dort, wo eine Kurve 3 dB unter ihren Höchstwert fällt; eine Senke ist ein Einbruch von mindestens 2 dB unter beide Seiten.
doc-network-spice = Der Rechner stimmt mit einem allgemeinen Schaltungssimulator (ngspice) auf 0,05 dB und 0,5° überein;
doc-network-netlist = schreibt das Netzwerk für einen solchen.
doc-col-rate-before = Frequenz vorher
doc-col-gain-needed = Nötige Verstärkung
doc-col-rate-after = Frequenz nachher
doc-col-rate = Frequenz
doc-oscillator-note = Die Frequenz ist die, bei der das Netzwerk das Signal um 180° dreht; die Stufe, auf die es zurückwirkt, muss dort den Verlust (die nötige Verstärkung) ausgleichen, damit die Schwingung einsetzt.
doc-no-mods = Die Schaltung wurde nicht geändert.
doc-notes = Anmerkungen
doc-line-up = Röhrenbestückung
doc-col-channel = Kanal
doc-col-position = Position
doc-col-type = Typ
doc-col-role = Aufgabe
doc-col-rated-as = Daten von
doc-col-fitted = In einer Messreihe bestückt
doc-no-valves = Keine Röhren angegeben.
doc-measurements-of = Messwerte: { $label }
doc-as-handed-over = (bei Übergabe)
doc-set-mains = Netz gemessen mit { $mains }; Werte „bei { $nominal }“ sind mit dem Faktor { $factor } auf die Nennspannung umgerechnet.
doc-fitted-bold = Für diese Messungen bestückte Röhren:
doc-fitted-ratings = Ihre Werte beruhen auf den Grenzdaten des bestückten Typs.
doc-bias-controls = { $count ->
        [one] Bias-Regler:
       *[other] Bias-Regler:
    }
doc-supply = Versorgungsspannungen
doc-col-node = Punkt
doc-col-feeds = Versorgt
doc-col-measured = Gemessen
doc-col-at = Bei { $nominal }
doc-col-expected = Erwartet
doc-col-deviation = Abweichung
doc-col-band = Band
doc-col-status = Status
doc-valves-idle = Röhren im Ruhezustand
doc-col-pos = Pos.
doc-col-of-max = vom Max.
doc-col-pct-nominal = % bei
    Nennspg.
doc-col-pct-high-line = % bei oberer
    Netzgrenze
doc-idle-from = Ruhestrom ermittelt aus: { $methods }.
doc-ik-note = „Ik“ kennzeichnet einen Anodenstrom, für den der ganze Kathodenstrom genommen wurde, der den Schirmgitterstrom einschließt: diese Verlustleistungen liegen auf der hohen Seite (vorsichtig gerechnet).
doc-limits-note = Die Grenzen sind die Röhrendaten, die bei den Hinweisen zur Methode aufgeführt sind.
doc-window = Zielbereich für feste Gittervorspannung
doc-col-valve = Röhre
doc-col-aim = Ziel, %
    vom Pa max
doc-col-ia-aim = Ia für
    das Ziel
doc-col-ia-now = Ia
    jetzt
doc-col-set-to = Einstellen auf
doc-col-reads-now = Anzeige
    jetzt
doc-grid-middle = etwa { $volts } am Gitter für die Mitte (Schätzung)
doc-grid-unknown = keine Schätzung der Gitterspannung für die Mitte: { $why }
doc-warm-up = Aufwärmen: Ruhestrom über der Zeit seit dem Einschalten
doc-col-time = Zeit
doc-warm-up-note = Jeder Messwert wird so ausgewertet wie die übrigen Messwerte der Reihe; die Röhrentabelle oben zeigt die eingeschwungenen Werte.
doc-warm-up-ik = „Ik“: der Kathodenstrom, der den Schirmgitterstrom einschließt.
doc-stressed = Belastete Bauteile
doc-col-ref = Bez.
doc-col-where = Wo
doc-col-value = Wert
doc-col-rating = Belastbarkeit
doc-col-dissipation = Verlustleistung
doc-col-pct-rating = % der
    Belastbarkeit
doc-col-at-high-line = Bei oberer
    Netzgrenze
doc-col-rated = Nennspg.
doc-col-working = Betriebsspg.
doc-col-high-line = Obere Grenze
doc-col-cold-start = Kaltstart-
    spitze
doc-col-highest = Höchste
doc-col-margin = Reserve
doc-col-load-counted = Gezählte Last
doc-col-load-at-least = Last,
    mindestens
doc-col-rated-output = Nenn-
    strom
doc-valve-rectifier = Gleichrichterröhre { $type }
doc-rectifier-note = Der Gleichrichter speist auch den Rest der Schaltung (Vorstufe, Phasenumkehr, etwaige Schirmgitter- und Bias-Versorgung), der hier nicht mitgezählt ist.
doc-heaters = Heizversorgung
doc-col-heater = Heizung
doc-col-nominal = Nennwert
doc-col-at-nominal-mains = Bei Netz-
    nennspannung
doc-heater = Heizung
doc-suggest-heading = Kathodenwiderstand { $reference }: welcher Wert passt (eine Schätzung)
doc-suggest-today = Jetzt ist { $reference } ein { $present } unter { $valves }; { $calibrated } setzt { $pa } um.
doc-suggest-aiming = Mit dem Ziel { $target } ergibt das an diese Messwerte angepasste 3/2-Potenzgesetz des Röhrenstroms
doc-suggest-none = keinen Widerstand: selbst ganz ohne Widerstand käme die Röhre nicht auf das Ziel
doc-col-series = Reihe
doc-col-fit = Wert
doc-col-about = etwa
doc-col-ik-each = Ik je Röhre
doc-col-resistor-dissipates = Widerstand
    setzt um
doc-col-resistor-rating = Belastbarkeit des Widerstands
doc-rating-at-least = mindestens { $least } (das Doppelte seiner Verlustleistung): ein Bauteil mit { $rating }
doc-estimate-bold = Dies ist eine Schätzung aus einer einzigen Messreihe, keine Messung.
doc-estimate = Den neuen Widerstand einbauen, die Röhren auf Betriebstemperatur kommen lassen und den Ruhestrom vor der Rückgabe erneut messen; die gemessenen Werte entscheiden.
doc-law = Das Gesetz: Ik = K × (Vg2k ÷ μg1g2 + Vgk)^1.5 mit μg1g2 { $mu } aus der Röhrendatentabelle und K = { $constant }, so angepasst, dass es den heutigen Messwert genau trifft; Vk = n × Ik × Rk für die Röhren am gemeinsamen Widerstand.
doc-law-voltages = Anoden- und Schirmgitterspannung sind wie gemessen genommen (das Absinken der Versorgung ist vernachlässigt)
doc-law-ik = , und als Anodenstrom gilt der ganze Kathodenstrom, wie in der Tabelle oben
doc-law-series = Die Werte sind die nächsten Werte der Reihen E12 und E24 nach IEC 60063.
doc-bench = Messungen am Prüfplatz
doc-col-output-power = Ausgangsleistung
doc-col-reading = Messwert
doc-col-load = Last
doc-col-frequency = Frequenz
doc-col-condition = Bedingung
doc-col-power = Leistung
doc-col-pct-rated = % der
    Nennleistung
doc-pct-of = { $pct } von { $rated }
doc-col-hum-noise = Brumm und Rauschen
doc-col-input = Eingang
doc-col-volume = Lautstärke
doc-col-across-load = An der
    Last
doc-col-below-full = Unter voller
    Leistung
doc-col-compared = Bezogen auf
doc-level-into = { $level } an { $load }
doc-nothing-to-compare = kein Bezugswert
doc-col-response = Frequenzgang
doc-row-output-v = Ausgang, V
doc-row-db-against = dB bezogen auf { $reference }
doc-minus3-points = −3-dB-Punkte:
doc-and = und
doc-for-input = , bei { $input } am Eingang
doc-into-load = an { $load }
doc-response-record = Zur Dokumentation; für den Frequenzgang gibt es keine Bestehensgrenze.
doc-col-gain = Verstärkung
doc-col-in = Ein
doc-col-out = Aus
doc-col-ratio = Faktor
doc-measurements = Messwerte
doc-no-measurements = Es wurden keine Messwerte erfasst.
doc-charts = Diagramme
doc-chart-dissipation = Endröhren: Anodenverlustleistung im Verhältnis zum Grenzwert
doc-chart-dissipation-note = Jeder Balken ist eine Röhre in einer Messreihe, bei der Netzspannung jenes Tages, als Anteil an ihrer höchsten Anodenverlustleistung. Die dicke Linie ist 100 % des Grenzwerts.
doc-chart-supply = Versorgungskette: Spannungen im Vergleich zur Spannungstabelle
doc-chart-supply-note = Graue Säulen umfassen die erwartete Spannung jedes Punkts (der Tabellenwert umgerechnet auf { $nominal } Netzspannung, gestrichelt) plus und minus ihrer Toleranz. Die Marken sind die auf { $nominal } Netzspannung umgerechneten Messwerte.
doc-chart-response = Frequenzgang am Prüfplatz
doc-chart-response-note = Jede Linie ist eine Frequenzgangmessung in dB bezogen auf ihre Bezugsfrequenz, über einer logarithmischen Frequenzachse. Die gestrichelte Linie ist −3 dB; die senkrechten Striche darauf markieren die −3-dB-Punkte, gefunden durch Interpolation zwischen den beiden Messwerten auf jeder Seite.
doc-safety = Elektrische Sicherheitsprüfungen
doc-protection-class = Schutzklasse: { $class }.
doc-col-test = Prüfung
doc-col-limit = Grenzwert
doc-col-result = Ergebnis
doc-safety-limits-note = Die Grenzwerte hat die Werkstatt für diesen Auftrag festgelegt. Sie müssen den Vorschriften entsprechen, die am Einsatzort des Geräts gelten.
doc-safety-none = Der Sicherheitsblock enthält keine Prüfungen.
doc-safety-missing = Für diesen Auftrag wurden keine elektrischen Sicherheitsprüfungen erfasst.
doc-charges = Kosten
doc-col-item = Posten
doc-col-hours = Stunden oder
    Menge
doc-col-rate-price = Satz oder
    Preis
doc-col-amount = Betrag
doc-labour = Arbeitszeit
doc-parts-charged = Teile
doc-subtotal = Zwischensumme
doc-tax-at = { $name } zu { $rate }
doc-total = Gesamt, { $currency }
doc-rounding = Jede Zeile ist auf zwei Nachkommastellen gerundet (Hälften aufwärts)
doc-tax-on-subtotal = ; { $name } wird auf die Zwischensumme berechnet
doc-hand-over = Übergabe
doc-warranty = Gewährleistung
doc-warranty-until = Gewährleistungsfrist: { $period }, vom Fertigstellungsdatum bis { $until }.
doc-warranty-from = Gewährleistungsfrist: { $period } ab dem Fertigstellungsdatum.
doc-terms = Bedingungen
doc-signature = Unterschrift
doc-date = Datum
doc-handed-over = Das oben beschriebene Gerät wurde mit diesem Protokoll übergeben. Der Kunde bestätigt den Erhalt des Geräts und dieses Protokolls einschließlich des Hinweises zur Netzsicherheit.
doc-sign-technician = Techniker
doc-method = Methode und Annahmen
doc-method-intro = Jeder Wert in diesem Protokoll ist entweder ein Messwert aus der Auftragsdatei oder nach den folgenden Regeln aus Messwerten berechnet. Spannungen sind Gleichspannungen gegen Chassis, sofern nicht anders angegeben. Mit *gängige Praxis* gekennzeichnete Richtbereiche sind Faustregeln des Handwerks ohne eine einzelne veröffentlichte Quelle; mit *aus dem Gedächtnis* gekennzeichnete Werte stammen aus veröffentlichten Daten und sollten mit dem Datenblatt geprüft werden. Jeder Bereich ist eine Einstellung des Auftrags; die hier verwendeten Werte sind angegeben.
doc-ratings-used = Verwendete Röhrendaten
doc-col-class = Klasse
doc-col-positions = Positionen
doc-col-limits-used = Verwendete Grenzwerte
doc-col-source-note = Quellenangabe
doc-col-from = Herkunft
doc-no-types = Es wurden keine Röhrentypen verwendet.
doc-how = Wie die Werte berechnet werden
doc-m-idle = *Ruhestrom.* Bei einem Kathodenwiderstand Rk, den n Röhren teilen, ist der Kathodenstrom jeder Röhre Ik = Vk ÷ (n × Rk); eigener Widerstand: n = 1. Über einem Messwiderstand Rs gilt Ik = Vs ÷ Rs. Nach der Übertragerwiderstands-Methode ist Ia = Vdrop ÷ Rhalf, mit Rhalf kalt und spannungslos gemessen (geteilt durch n, wo n Röhren eine Primärhälfte teilen). Ein Shunt über der halben Primärwicklung oder ein Bias-Messadapter liefert den Strom direkt.
doc-m-matched-cathode = *Annahme gepaarter Röhren:* dieser Auftrag hat einen gemeinsamen Kathodenwiderstand, daher nehmen die Werte an, dass sich die Röhren daran den Strom gleichmäßig teilen.
doc-m-matched-primary = *Annahme gepaarter Röhren:* Röhren an einer gemeinsamen Primärhälfte teilen sich deren Strom nach dieser Annahme gleichmäßig.
doc-m-screen = *Schirmgitterstrom.* Wo ein Schirmgitterwiderstand den Schirmgitterstrom liefert, gilt Ig2 = (Vsupply − Vg2) ÷ Rg2 und Ia = Ik − Ig2. Sonst gilt der ganze Kathodenstrom als Anodenstrom (Ia = Ik), der den Schirmgitterstrom einschließt: diese *vorsichtige Regel*, in den Tabellen mit „Ik“ gekennzeichnet, ergibt Verlustleistungen auf der hohen Seite.
doc-m-screen-used = Die Werte dieses Auftrags verwenden sie.
doc-m-dissipation = *Verlustleistung.* Anode: Pa = (Va − Vk) × Ia. Schirmgitter: Pg2 = (Vg2 − Vk) × Ig2. „% vom Max.“ ist der Wert im Verhältnis zum Grenzwert in der Tabelle oben.
doc-m-mains = *Netzkorrektur (erster Ordnung).* Transformatorgespeiste Spannungen werden als proportional zur Netzspannung angenommen: ein Messwert V bei der Netzspannung Vm wird zu V × Vn ÷ Vm bei der Nennspannung Vn = { $nominal }. Ströme ändern sich ebenso, daher die Verlustleistung mit dem Quadrat: P × (Vn ÷ Vm)². Das ist eine Näherung; Innenwiderstand der Versorgung und Gleichrichterverlust bleiben unberücksichtigt.
doc-m-high-line = *Obere Netzgrenze.* Die Versorgung kann um ihre Toleranz t = { $tolerance } über der Nennspannung liegen, bis { $high_line }; die hochgerechnete Verlustleistung ist P(Nenn) × (1 + t)², die hochgerechnete Spannung V(Nenn) × (1 + t). Die Standardtoleranzen stammen aus dem Gedächtnis aus den Versorgungsnormen (+5 % für 120-V-Netze, ANSI C84.1 Bereich A; ±10 % für 230 V, IEC 60038).
doc-m-chart-title = Spannungstabelle.
doc-m-chart-design = Die Tabelle des Herstellers gilt für { $design } Netzspannung, daher wird jeder Tabellenwert als V(Tabelle) × Vn ÷ Vd mit Vd = { $design } auf die Nennspannung umgerechnet.
doc-m-chart-nominal = Die Tabellenwerte gelten als bei Netznennspannung aufgenommen.
doc-m-chart-band = Ein Punkt ist normal innerhalb seines Bands um diesen erwarteten Wert ({ $tolerance }, sofern der Auftrag keinen anderen Wert setzt; gängige Praxis, viele Tabellen nennen ±10 % oder ±20 %).
doc-m-bands-title = Richtbereiche (gängige Praxis).
doc-m-bands-fixed = Feste Gittervorspannung, Gegentakt: Ziel { $low } bis { $high } von Pa max; darüber Vorsicht, darunter „zu kalt“ (Gefahr von Übernahmeverzerrungen), über 100 % überschritten.
doc-m-bands-cathode = Kathodenautomatik: Vorsicht über { $caution }, über 100 % überschritten.
doc-m-bands-parts = Widerstände: Vorsicht über { $derating } ihrer Belastbarkeit (Derating), über 100 % überschritten. Siebkondensatoren: überschritten über der Nennspannung, Vorsicht, wenn weniger als { $margin } davon übrig bleiben. Heizung: { $heater } vom Nennwert. Anoden- und Schirmgitterspannungen: Vorsicht über dem veröffentlichten Höchstwert (oder wenn die Hochrechnung auf die obere Netzgrenze ihn überschreitet), überschritten mehr als { $over } darüber; Gitarrenverstärker betreiben Endröhren oft über den Spannungshöchstwerten nach dem Design-Center-System, und die Anodenverlustleistung bestimmt die Lebensdauer der Röhre.
doc-m-window = *Zielbereich.* Bei fester Gittervorspannung ist der Anodenstrom, der eine Röhre ins Ziel bringt, Ia = f × Pa(max) ÷ (Va − Vk) für f von { $low } bis { $high }; er wird auch als der Wert angegeben, den der Techniker einstellt (Millivolt über einem Messwiderstand, der auch den Schirmgitterstrom führt, oder Volt über der halben Primärwicklung).
doc-m-bench = *Am Prüfplatz.* Messungen an einem Lastwiderstand mit der Lautsprecherimpedanz. Ausgangsleistung P = V²eff ÷ R; ein Spitze-Spitze-Wert eines Sinus ist Veff = Vss ÷ (2√2). Messungen an der Clipping-Grenze oder bei angegebenem Klirrfaktor unter { $power } der Nennleistung des Geräts sind ein Vorsichtsfall (gängige Praxis: ein gesundes älteres Gerät erreicht etwa 80 % oder mehr). Brumm und Rauschen in dBV ist 20 × log10(V ÷ 1 V); unter voller Leistung 20 × log10(Vvoll ÷ VRausch), mit Vvoll = √(P × R) aus der höchsten an der Clipping-Grenze oder bei angegebenem Klirrfaktor gemessenen Ausgangsleistung, sonst der Nennleistung; weniger als { $hum } ist ein Vorsichtsfall (gängige Praxis). Der Frequenzgang in dB ist 20 × log10(V ÷ Vref) bezogen auf die Bezugsfrequenz; die −3-dB-Punkte werden linear in dB über einer logarithmischen Frequenzachse zwischen den Messwerten auf beiden Seiten interpoliert. Die Verstärkung ist 20 × log10(Vaus ÷ Vein).
doc-m-estimates = *Bias-Schätzungen.* Das 3/2-Potenzgesetz des Röhrenstroms (der Kathodenstrom wächst mit der wirksamen Steuerspannung hoch 3/2; Child–Langmuir, wie es die klassischen Röhrenhandbücher auf Pentoden anwenden; aus dem Gedächtnis), Ik = K × (Vg2k ÷ μg1g2 + Vgk)^1.5, wird an die Messwerte einer Röhre angepasst, sodass es sie genau wiedergibt; μg1g2 stammt aus der Röhrendatentabelle (aus dem Gedächtnis nach Herstellerdaten).
doc-m-estimates-resistor = Für einen Kathodenwiderstand findet es den Wert, der die heißeste Röhre daran auf { $target } ihrer Anodenverlustleistung bringt (gängige Praxis), mit Vk = n × Ik × Rk, und rundet auf die nächsten Werte der Reihen E12 und E24 nach IEC 60063; die Verlustleistung des Widerstands ist Vk² ÷ Rk, und seine Belastbarkeit sollte mindestens das Doppelte betragen (gängige Praxis).
doc-m-estimates-grid = Bei fester Gittervorspannung gibt es die Gitterspannung für die Mitte des Zielbereichs an; maßgeblich bleiben die Stromwerte des Zielbereichs.
doc-m-estimates-sag = Anoden- und Schirmgitterspannung sind wie gemessen genommen, ohne das Absinken der Versorgung: es sind Schätzungen aus einem einzigen Punkt, und der Ruhestrom muss nach jeder Änderung neu gemessen werden.
doc-m-stressed = *Belastete Bauteile.* Vorwiderstand zwischen zwei Punkten: P = (V1 − V2)² ÷ R. Kathodenwiderstand: P = Vk² ÷ Rk. Beide werden wie die Röhren auf die obere Netzgrenze hochgerechnet. Ein Siebkondensator muss die höchste Spannung aushalten, die an ihm auftreten kann: seine auf die obere Netzgrenze hochgerechnete Betriebsspannung oder die Kaltstartspitze, je nachdem, welche höher ist; die Reserve ist, was von seiner Nennspannung übrig bleibt.
doc-m-cold-start = *Kaltstartspitze:* bevor die Röhren Strom ziehen, lädt eine Zweiweg-Wicklung mit Vsec (effektiv, je Seite, bei der Primärspannung Vp angegeben) die ersten Kondensatoren auf etwa √2 × Vsec × V(obere Netzgrenze) ÷ Vp abzüglich des Gleichrichterverlusts (Silizium { $drop }; eine Gleichrichterröhre ohne Last etwa 0 V). Silizium- und direkt geheizte Gleichrichterröhren erreichen diesen Wert tatsächlich, während die Endröhren aufheizen.
doc-m-judging = *Beurteilung des Geräts bei der Übergabe.* Die Zusammenfassung auf Seite 1, die Übersicht „Auf einen Blick“ und die Liste der offenen Befunde beziehen sich auf die letzten Messwerte
doc-m-judging-label = („{ $label }“)
doc-m-judging-rest = , also den Zustand, in dem das Gerät übergeben wird; die früheren Messwerte sind seine Vorgeschichte. Ein Wert, den der Techniker als annehmbar beurteilt hat, behält in den Tabellen seinen Status und seine Zahlen, wird mit Begründung, Name und Datum als AKZEPTIERT gekennzeichnet und zählt nicht mehr gegen das Gerät. Die Begründung jedes Status nennt den Wert, der ihn entschieden hat.

## Hinweis zur Netzsicherheit (templates/mains-safety.typ): nur als Ganzes
## übersetzbar. `notice-check-opening` ist wörtlich der erste Satz von
## `notice-deadly`, `notice-check-closing` der letzte Satz von `notice-codes`.

notice-heading = NETZSICHERHEIT: VOR GEBRAUCH ODER ÖFFNEN DES GERÄTS LESEN
notice-deadly-title = Lebensgefahr
notice-deadly = Dieser Verstärker arbeitet mit Spannungen, die tödlich sein können. Im eingeschalteten Zustand führen Teile im Chassis mehrere hundert Volt Gleichspannung, und die Netzverdrahtung führt die volle Netzspannung.
notice-stored-title = Restladung
notice-stored = Die Siebkondensatoren können noch lange nach dem Ausschalten und Ziehen des Netzsteckers eine gefährliche Ladung halten: Minuten, Stunden, manchmal Tage.
notice-who-title = Wer öffnen darf
notice-who = Nur eine für diese Arbeit ausgebildete und ausgerüstete Person darf das Chassis öffnen. Vor jeder Berührung im Inneren die Kondensatoren entladen und durch Messen prüfen, dass sie entladen sind.
notice-earth-title = Schutzleiter
notice-earth = Den Schutzleiter der Netzleitung niemals entfernen, durchtrennen oder überbrücken, und niemals einen Adapter oder Stecker verwenden, der den Schutzleiter unterbricht. Nur eine richtig angeschlossene Steckdose mit Schutzleiter verwenden.
notice-fuses-title = Sicherungen
notice-fuses = Eine Sicherung nur durch eine des Typs und Werts ersetzen, die am Gerät angegeben sind. Eine größere Sicherung behebt keinen Fehler; sie lässt den Fehler mehr Schaden anrichten.
notice-document-title = Dieses Protokoll
notice-document = Die Messwerte beschreiben das Gerät an den angegebenen Tagen bei der damals anliegenden Netzspannung. Sie dokumentieren die ausgeführte Arbeit, sind keine Bescheinigung der elektrischen Sicherheit und sagen nichts darüber, wie sich das Gerät später oder nach anderen Arbeiten verhält.
notice-codes-title = Örtliche elektrotechnische Vorschriften gehen vor.
notice-codes = Netzverdrahtung, Schutzleiteranschluss und elektrische Sicherheitsprüfungen müssen den elektrotechnischen Vorschriften und Bestimmungen entsprechen, die am Einsatzort des Geräts gelten. Wo diese Vorschriften oder die Praxis einer zugelassenen Elektrofachkraft von etwas in diesem Protokoll abweichen, gelten sie.
notice-check-opening = Dieser Verstärker arbeitet mit Spannungen, die tödlich sein können.
notice-check-closing = Wo diese Vorschriften oder die Praxis einer zugelassenen Elektrofachkraft von etwas in diesem Protokoll abweichen, gelten sie.

## Vom Programm gebildete feste Wörter (src/report/handover).

doc-title = Übergabeprotokoll { $id }: { $make } { $model }
doc-description = Übergabeprotokoll zur Wartung eines Röhrenverstärkers, Auftrag { $id }
doc-description-shop = Übergabeprotokoll zur Wartung eines Röhrenverstärkers, Auftrag { $id }, von { $shop }
doc-glance-basis = Messwerte „{ $label }“ bei { $mains } Netzspannung
doc-glance-none = Keine Messwerte erfasst
doc-group-channel = Kanal: { $channel }
doc-group-shared = Gemeinsam
period-days = { $count ->
        [one] { $count } Tag
       *[other] { $count } Tage
    }
period-weeks = { $count ->
        [one] { $count } Woche
       *[other] { $count } Wochen
    }
period-months = { $count ->
        [one] { $count } Monat
       *[other] { $count } Monate
    }
period-years = { $count ->
        [one] { $count } Jahr
       *[other] { $count } Jahre
    }

## Wörter der Tabellenzeilen, die das Programm bildet
## (src/report/handover/context.rs und context/bench.rs).

doc-window-inside = im Ziel
doc-window-above = darüber
doc-window-below = darunter
doc-per-hour = { $price } pro Stunde
doc-each = { $price } je Stück
doc-yes = ja
doc-no = nein
role-preamp = Vorstufe
role-phase-inverter = Phasenumkehr
role-output = Endstufe
role-rectifier = Gleichrichter
role-tremolo = Tremolo
role-reverb-driver = Hall-Treiber
role-reverb-recovery = Hall-Rückgewinnung
role-other = sonstige
doc-type-in-set = { $type } in „{ $set }“
doc-type-change = { $position }: { $type } (Bestückung: { $line_up })
doc-kind-dropper = Siebwiderstand
doc-kind-cathode-resistor = Kathodenwiderstand
doc-kind-screen-resistor = Schirmgitterwiderstand
doc-kind-filter-capacitor = Siebkondensator
doc-across-sense-named = am Messwiderstand { $reference } ({ $ohms })
doc-across-sense-value = am Messwiderstand ({ $ohms })
doc-across-sense = am Messwiderstand
doc-across-primary-value = über der halben Primärwicklung ({ $ohms })
doc-across-primary-shared = über der halben Primärwicklung ({ $ohms }, gemeinsam mit { $others })
doc-across-primary = über der halben Primärwicklung
doc-across-probe = Kathodenstrom am Bias-Messadapter
doc-counted-outputs = die Kathodenströme der Endröhren
doc-counted-of = Kathodenströme von { $valves }
doc-figure-rc-corner = RC-Eckfrequenz
doc-figure-cathode-bypass = Eckfrequenz der Kathodenüberbrückung
doc-figure-stage-gain = Stufenverstärkung
doc-figure-phase-shift = Phasenschieber-Oszillator
doc-chart-band-fixed = Das graue Band ist das Ziel bei fester Gittervorspannung, { $low }–{ $high } % des Grenzwerts.
doc-chart-band-cathode = Die gestrichelte Linie ist die Vorsichtsgrenze bei Kathodenautomatik, { $caution } % des Grenzwerts.
doc-class-one = I (mit Schutzleiter)
doc-class-two = II (schutzisoliert)
doc-test-earth-continuity = Schutzleiterwiderstand
doc-test-insulation = Isolationswiderstand
doc-test-leakage = Ableitstrom (Berührungsstrom)
doc-pass = bestanden
doc-fail = nicht bestanden
doc-bands-shop = aus dem Profil der Werkstatt: { $names }
doc-bands-job = für diesen Auftrag gesetzt: { $names }
doc-bands-defaults = { $sets }; die übrigen sind die eingebauten Voreinstellungen
doc-valve-class-output-pentode = Endpentode
doc-valve-class-beam-tetrode = Beam-Tetrode
doc-valve-class-power-triode = Leistungstriode
doc-valve-class-preamp-triode = Vorstufentriode
doc-valve-class-preamp-pentode = Vorstufenpentode
doc-valve-class-rectifier = Gleichrichter
doc-built-in = eingebaut
doc-input-shorted = kurzgeschlossen
doc-input-open = offen
doc-against-rated = Nennleistung { $watts }
doc-against-measured = gemessen { $watts }
doc-below = unter { $frequency }
doc-above = über { $frequency }
doc-suggest-hottest = { $valve } ({ $type }), die heißeste Röhre daran,
doc-suggest-asked = Der Auftrag verlangt einen Vorschlag für diese Messreihe.
doc-suggest-shown = Gezeigt, weil die Anodenverlustleistung über dem Richtwert von { $caution } % für Kathodenautomatik liegt.
doc-suggest-present = { $watts } W, { $pct } % von { $max }
doc-suggest-target = { $pct } % von { $max }, { $watts } W

## Die festen Wörter der Diagramme (src/report/plots.rs, plots/warm_up.rs,
## response_chart.rs, network_chart.rs) und der Netzwerkansicht einer
## Änderung (src/report/handover/context/network_view.rs).

chart-span = { $first } bis { $last }
chart-part-readings = Messreihen { $span }
chart-part-curves = Kurven { $span }
chart-dissipation-axis = Anodenverlustleistung, % des Grenzwerts
chart-fixed-bias-aim = Zielbereich
chart-caution = Vorsicht { $pct } %
chart-full-rating = 100 % Grenzwert
chart-expected-band = Sollwert ± Toleranz
chart-supply-axis = Volt DC, umgerechnet auf { $nominal } V Netz
chart-db-against-reference = dB zur Bezugsfrequenz
chart-frequency-axis = Frequenz, Hz (logarithmisch)
chart-minus-3db-point = −3-dB-Punkt
chart-idle-current-ik = Ruhestrom (Ik), mA
chart-idle-current = Ruhestrom, mA
chart-minutes = Minuten nach dem Einschalten
chart-before-mod = vor der Änderung
chart-after-mod = danach
chart-setting = Stellung { $number }: { $pots }
chart-pots-at = Potis auf { $pots }
chart-db-at-load = dB an der Last
doc-network-scoop = Senke bei { $frequency }, { $depth } tief
doc-network-flat = eben innerhalb 3 dB
doc-network-low-cut = Tiefenabsenkung { $frequency }
doc-network-high-cut = Höhenabsenkung { $frequency }
doc-network-loaded = Abgegriffen an Knoten { $node }, belastet mit { $ohms } gegen Masse.
doc-network-unloaded = Abgegriffen an Knoten { $node }, unbelastet.
doc-network-driven = Gespeist an Knoten { $node } von { $source }.
doc-network-driven-when = Gespeist an Knoten { $node } ({ $state }) von { $source }.
doc-network-own-gain = Deren eigene Verstärkung, etwa { $gain }, ist in den Kurven nicht enthalten.
doc-network-default-label = Netzwerk
doc-network-never = nie 180°
doc-network-pot-setting = Stellung { $pot }
doc-network-setting = Stellung

## Die Zusammenfassung in einfachen Worten auf Seite 1 (src/report/summary.rs).
## `$names` ist eine Aufzählung („V3 und V4“), `$range` ein Prozentwert oder
## Bereich („67–68 %“), `$troubles` eine Aufzählung der Wendungen darüber.

summary-valves-hot = { $count ->
        [one] Endröhre { $names } läuft heiß
       *[other] Endröhren { $names } laufen heiß
    } ({ $range } der Anodenverlustleistung)
summary-valves-cold = { $count ->
        [one] Endröhre { $names } läuft zu kalt
       *[other] Endröhren { $names } laufen zu kalt
    } ({ $range } der Anodenverlustleistung)
summary-valves-beyond = { $count ->
        [one] Endröhre { $names } über der zulässigen Anodenverlustleistung
       *[other] Endröhren { $names } über der zulässigen Anodenverlustleistung
    } ({ $range })
summary-valves-high-line = { $count ->
        [one] Endröhre { $names } nahe an der zulässigen Anodenverlustleistung
       *[other] Endröhren { $names } nahe an der zulässigen Anodenverlustleistung
    } an der oberen Netzgrenze ({ $range })
summary-screen-hot = zu hohe Schirmgitterverlustleistung an { $names } ({ $range } des Grenzwerts)
summary-voltage-max = Röhrenspannungen über dem veröffentlichten Höchstwert an { $names }
summary-cathode-current = mehr als der zulässige Kathodenstrom an { $names }
summary-nodes-off = Versorgungsspannungen abweichend von der Spannungstabelle an { $names }
summary-resistor-over = Widerstand { $name } überlastet mit { $pct } seiner Belastbarkeit
summary-resistors-over = Widerstände { $names } überlastet
summary-resistors-warm = { $count ->
        [one] Widerstand { $names } wird warm
       *[other] Widerstände { $names } werden warm
    }
summary-capacitors-over = { $count ->
        [one] Kondensator { $names } für eine niedrigere Spannung ausgelegt, als er sehen kann
       *[other] Kondensatoren { $names } für eine niedrigere Spannung ausgelegt, als sie sehen können
    }
summary-capacitors-margin = wenig Spannungsreserve { $count ->
        [one] am Kondensator { $names }
       *[other] an den Kondensatoren { $names }
    }
summary-rectifier-load = Gleichrichterröhre { $names } mit { $range } ihres Nennstroms belastet
summary-heater-low = Heizspannung { $pct } % zu niedrig
summary-heater-high = Heizspannung { $pct } % zu hoch
summary-found-ok = Die Messreihe „{ $label }“ zeigte alle Werte innerhalb ihrer Grenzen.
summary-found = Die Messreihe „{ $label }“ zeigte: { $troubles }.
summary-parts = { $count ->
        [one] Ein Bauteil wurde ersetzt ({ $parts }).
       *[other] { $count } Bauteile wurden ersetzt ({ $parts }).
    }
summary-mods = { $count ->
        [one] Eine Änderung wurde vorgenommen (unten aufgeführt).
       *[other] { $count } Änderungen wurden vorgenommen (unten aufgeführt).
    }
summary-type-change = In { $position } steckt jetzt eine { $now } (vorher eine { $was }).
summary-idle-now = Die Endröhren arbeiten jetzt im Ruhezustand mit { $now } ihrer Anodenverlustleistung (vorher { $was }).
summary-now-ok = { $accepted ->
        [0] Bei der Übergabe („{ $label }“) liegen alle Werte innerhalb ihrer Grenzen.
        [one] Bei der Übergabe („{ $label }“) liegen alle Werte innerhalb ihrer Grenzen, bis auf einen, den der Techniker beurteilt und akzeptiert hat (unten aufgeführt).
       *[other] Bei der Übergabe („{ $label }“) liegen alle Werte innerhalb ihrer Grenzen, bis auf { $accepted }, die der Techniker beurteilt und akzeptiert hat (unten aufgeführt).
    }
summary-now-open = Bei der Übergabe („{ $label }“) braucht noch Aufmerksamkeit: { $troubles }.
summary-no-measurements = Es wurden keine Messungen festgehalten.
summary-no-safety = Es wurden keine elektrischen Sicherheitsprüfungen festgehalten.
summary-safety-failed = { $count ->
        [one] Die Prüfung { $tests } hat den Grenzwert der Werkstatt nicht eingehalten.
       *[other] Die Prüfungen { $tests } haben den Grenzwert der Werkstatt nicht eingehalten.
    }
summary-safety-ok = { $count ->
        [one] Die elektrische Sicherheitsprüfung hat den Grenzwert der Werkstatt eingehalten.
       *[other] Alle { $count } elektrischen Sicherheitsprüfungen haben die Grenzwerte der Werkstatt eingehalten.
    }

## Was Aufmerksamkeit braucht, gruppiert (src/report/attention.rs).

attention-accepted = { $brief } (akzeptiert)

## Das Zustandsblatt für einen Verkauf (src/report/listing/words.rs): seine
## Beschriftungen und die Sätze, die es aus den Befunden bildet.

listing-kicker = Zustandsbericht
listing-serviced-by = Gewartet von
listing-service-record = Wartungsprotokoll
listing-the-unit = Das Gerät
listing-make = Hersteller
listing-model = Modell
listing-year = Baujahr
listing-serial = Seriennummer
listing-mains = Netz
listing-description = Beschreibung
listing-condition = Zustand
listing-health = Zustand beim Verlassen der Werkstatt
listing-check = Prüfung
listing-state = Status
listing-in-words = In Worten
listing-output-valve = Endröhre
listing-valve-type = Typ
listing-bias = Vorspannung
listing-idle = Ruhezustand, % der Anodenverlustleistung
listing-high-line = Obere Netzgrenze
listing-safety-tests = Elektrische Sicherheitsprüfungen
listing-no-safety-tests = Es wurden keine elektrischen Sicherheitsprüfungen festgehalten.
listing-limit = Grenzwert
listing-serviced = Was gewartet wurde
listing-part = Teil
listing-was = Vorher
listing-now = Jetzt
listing-why = Warum
listing-no-parts = Es wurden keine Teile ersetzt.
listing-findings = Befund
listing-work = Ausgeführte Arbeiten
listing-originality = Originalzustand
listing-item = Posten
listing-change = Änderung
listing-reversible = Rückbaubar
listing-original-kept = Original aufbewahrt
listing-not-listed = Was nicht aufgeführt ist, wurde bei dieser Wartung nicht verändert; ob es das Original des Herstellers ist, wurde nicht geprüft.
listing-notes = Anmerkungen
listing-photos = Fotos
listing-made-with = Erstellt mit ampreport
listing-commit = Commit
listing-edits = + Änderungen
listing-job-file-sha = SHA-256 der Auftragsdatei
listing-page = Seite
listing-of = von
listing-bias-fixed = fest
listing-bias-cathode = Kathode
listing-title = Zustandsbericht: { $name }
listing-pdf-description = Zustands- und Wartungsübersicht eines { $name } für eine Verkaufsanzeige
listing-no-measurements = Bei dieser Wartung wurden keine Messungen festgehalten.
listing-all-inside = { $accepted ->
        [0] Beim Verlassen der Werkstatt liegen alle gemessenen Werte innerhalb ihrer Grenzen.
        [one] Beim Verlassen der Werkstatt liegen alle gemessenen Werte innerhalb ihrer Grenzen, bis auf einen, den der Techniker als annehmbar beurteilt hat.
       *[other] Beim Verlassen der Werkstatt liegen alle gemessenen Werte innerhalb ihrer Grenzen, bis auf { $accepted }, die der Techniker als annehmbar beurteilt hat.
    }
listing-needs-attention = Beim Verlassen der Werkstatt braucht noch Aufmerksamkeit: { $families }.
listing-accepted-only = innerhalb der Grenzen, bis auf das, was der Techniker als annehmbar beurteilt hat: { $what }
listing-readings = Messwerte „{ $label }“
listing-at-mains = , bei { $volts } Netzspannung
listing-state-ok = ok
listing-state-caution = Vorsicht
listing-state-over = zu hoch
listing-state-cold = zu kalt
listing-state-accepted = akzeptiert
listing-state-not-measured = nicht gemessen
listing-change-replaced = ersetzt
listing-change-modified = geändert
listing-parts-replaced = { $count ->
        [0] keine Teile ersetzt
        [one] 1 Teil ersetzt
       *[other] { $count } Teile ersetzt
    }
listing-no-modifications = keine Änderungen
listing-how-reversible = rückbaubar
listing-all-reversible = alle rückbaubar
listing-not-reversible = nicht als rückbaubar angegeben
listing-some-reversible = { $count } rückbaubar
listing-modifications = { $count ->
        [one] { $count } Änderung ({ $how })
       *[other] { $count } Änderungen ({ $how })
    }
listing-originals-kept = Originalteile aufbewahrt: { $list }

## Das Terminal (`ampreport check`). Leerzeichen am Anfang oder Ende einer
## Meldung entfallen: das Programm setzt sie.

term-state-ok = ok
term-state-caution = VORSICHT
term-state-over = ZU HOCH
term-state-cold = ZU KALT
term-state-accepted = akzeptiert
term-state-unchecked = NICHT GEPRÜFT
term-job = Auftrag { $id }: { $make } { $model }
term-serial = Seriennummer { $serial }
term-mains = Netz: Nennspannung { $nominal }, obere Netzgrenze { $high_line } (+{ $tolerance } %)
term-chart-drawn = Spannungstabelle für { $design }
term-safety = Sicherheitsprüfungen
term-col-test = Prüfung
term-col-reading = Messwert
term-col-limit = Grenzwert
term-col-status = Status
term-pass = bestanden
term-fail = NICHT BESTANDEN
term-mod-figures = Berechnete Werte der Änderungen
term-final-set-labelled = „{ $label }“, den letzten Messwerten
term-final-set = den letzten Messwerten
term-no-open = Keine offenen Befunde in { $set }: jeder Wert liegt innerhalb seiner Grenzen oder ist akzeptiert.
term-open = Offene Befunde in { $set } ({ $count })
term-accepted-heading = Vom Techniker akzeptiert ({ $count })
term-word-ok = ok
term-word-caution = Vorsicht
term-word-over = zu hoch
term-word-cold = zu kalt
term-whole-job = Für den ganzen Auftrag
term-history = Befund in „{ $label }“
term-final-mark = letzte: bei Übergabe
term-set-mains = Netz { $mains }, Faktor { $factor } auf Nennspannung
term-fitted = Für diese Messungen bestückt: { $position } { $type } (Bestückung: { $line_up })
term-bias-control-labelled = Bias-Regler { $label }: { $position }
term-bias-control = Bias-Regler: { $position }
term-valves = Röhren
term-col-pos = Pos.
term-col-type = Typ
term-col-bias = Vorspannung
term-col-va = Va
term-col-vk = Vk
term-col-current = Strom
term-col-pa = Pa
term-col-pct-max = % max
term-col-high-line = obere Grenze
term-window-sense = { $low }–{ $high } mV über dem Messwiderstand
term-window-primary = { $low }–{ $high } V über der halben Primärwicklung
term-window-grid = Gitter etwa { $volts } für die Mitte
term-window-grid-unknown = keine Schätzung der Gitterspannung für die Mitte: { $why }
term-now = jetzt { $volts }
term-estimate = (Schätzung)
term-window = { $position } Zielbereich { $low }–{ $high } %
term-inside = innerhalb
term-outside = außerhalb
term-ik-note = Ik: als Anodenstrom gilt der Kathodenstrom einschließlich Schirmgitterstrom (vorsichtig gerechnet).
term-warm-up = Aufwärmen (Ruhestrom nach dem Einschalten)
term-col-valve = Röhre
term-col-after = nach
term-col-pa-pct-max = Pa % max
term-nodes = Versorgungspunkte
term-col-node = Punkt
term-col-measured = gemessen
term-col-corrected = korrigiert
term-col-expected = erwartet
term-col-deviation = Abweichung
term-stressed = Belastete Bauteile
term-col-part = Teil
term-col-where = wo
term-col-stress = Belastung
term-col-rating = Belastbarkeit
term-col-pct-margin = % / Reserve
term-peak = { $volts } Spitze
term-left = { $pct } % übrig
term-not-checked = nicht geprüft ({ $reason })
term-rectifier = Gleichrichter { $position } ({ $type }): mindestens { $load } mA von { $rating } mA ({ $pct } %)
term-heater = Heizung: { $measured } gegen { $nominal } ({ $deviation } %)
term-suggestion = Kathodenwiderstand { $reference } ({ $valves }, jetzt { $present }): für { $target } % von Pa max ({ $pa } W) ergibt das 3/2-Potenzgesetz des Röhrenstroms { $exact }
term-out-of-reach = keinen Widerstand (nicht erreichbar)
term-suggestion-option = { $series } { $value }: Vk { $vk }, { $current } je Röhre, Pa { $pa } W ({ $pct } %); der Widerstand setzt { $power } W um: Belastbarkeit { $least } W oder mehr (ein Bauteil mit { $rating })
term-suggestion-estimate = Eine Schätzung aus einer einzigen Messreihe ({ $calibrated }, μg1g2 { $mu }); den Ruhestrom nach der Änderung erneut messen.
term-bench = Messungen am Prüfplatz
term-rms = { $volts } eff.
term-peak-to-peak = { $volts } Spitze-Spitze = { $rms } eff.
term-output-power = Ausgangsleistung
term-output-power-line = { $reading } an { $load } bei { $frequency }, { $condition } = { $power } W
term-of-rated = { $pct } der Nennleistung
term-hum-noise = Brumm und Rauschen
term-hum-noise-line = { $mv } mV ({ $dbv } dBV), Eingang { $input }
term-volume = Lautstärke { $volume }
term-below-full = { $db } dB unter voller Leistung
term-response = Frequenzgang
term-against = bezogen auf { $reference }
term-in = { $volts } am Eingang
term-col-frequency = Frequenz
term-col-output = Ausgang
term-col-db = dB
term-below-not-reached = unter { $frequency } (nicht erreicht)
term-above-not-reached = über { $frequency } (nicht erreicht)
term-minus-3db = −3 dB: { $low } und { $high }
term-gain = Verstärkung
term-gain-line = { $input } am Eingang für { $output } am Ausgang bei { $frequency } = ×{ $times } ({ $db } dB)

## Begründungen und Schwellen der Prüfungen (src/calc), wie das Protokoll,
## das Terminal und `calc --json` sie in der Sprache der Werkstatt zeigen.

reason-includes-screen = (einschließlich Schirmgitterstrom, daher auf der hohen Seite)
reason-at-nominal-mains = bei Netznennspannung
reason-plate-dissipation = Anodenverlustleistung { $watts } W ist { $pct } % ihres Grenzwerts von { $rating }
threshold-fixed-bias = Ziel bei fester Gittervorspannung { $low }–{ $high } % von { $rating }; zu kalt unter { $low } %, Vorsicht über { $high } %, zu hoch über 100 %
reason-above-aim = über dem Ziel von { $high } %
reason-below-aim = unter dem Ziel von { $low } % (Gefahr von Übernahmeverzerrungen)
reason-inside-aim = innerhalb des Ziels
threshold-cathode-bias = Vorsicht über { $caution } % von { $rating }, zu hoch über 100 %
reason-above-guide = über dem Richtwert von { $caution } %
threshold-voltage-max = Vorsicht über dem Höchstwert von { $max } (oder wenn die Hochrechnung auf die obere Netzgrenze darüber liegt), zu hoch über { $over } % davon
reason-voltage-of-max = { $what } { $volts } ist { $pct } % ihres Höchstwerts von { $max }
reason-voltage-high-line = { $what } würde an der oberen Netzgrenze { $high } erreichen, über ihrem Höchstwert von { $max }
reason-voltage-within = { $what } ist { $pct } % ihres Höchstwerts
reason-plate-voltage = Anodenspannung
reason-screen-voltage = Schirmgitterspannung
threshold-node = innerhalb ±{ $tolerance } % der Tabelle, umgerechnet auf { $nominal }
reason-node = { $corrected } bei Netznennspannung weicht um { $deviation } % vom erwarteten Wert { $expected } ab
reason-above-band = über dem Band von ±{ $tolerance } %
reason-below-band = unter dem Band von ±{ $tolerance } %
reason-no-chart = kein Tabellenwert zum Vergleich
threshold-no-chart = keine: der Auftrag nennt keinen Tabellenwert
threshold-heater = innerhalb ±{ $tolerance } % von { $nominal }
reason-at-nominal = { $volts } bei Netznennspannung ({ $deviation } %)
reason-heater = { $measured } weicht um { $deviation } % von { $nominal } ab

## Begründungen: ein Wert gegen seinen Nennwert, die übrigen Prüfungen der
## Endröhren (src/calc/status.rs, src/calc/valve.rs).

threshold-under-rating = Vorsicht über { $caution } % von { $rating }, zu hoch über 100 %
reason-of-rating = { $what } ist { $pct } % des Nennwerts von { $rating }
reason-of-rating-guide = { $what } ist { $pct } % des Nennwerts von { $rating }, über dem Richtwert von { $caution } %
reason-plate-high-line = an der oberen Netzgrenze ({ $mains }) läge die Anodenverlustleistung bei { $watts } W, { $pct } % des Grenzwerts
threshold-plate-high-line = Vorsicht, wenn die Hochrechnung auf die obere Netzgrenze 100 % übersteigt
reason-screen-dissipation = Schirmgitterverlustleistung
threshold-screen-dissipation = zu hoch über 100 % von { $rating }; Vorsicht, wenn die Hochrechnung auf die obere Netzgrenze darüber liegt
reason-screen-high-line = die Schirmgitterverlustleistung läge an der oberen Netzgrenze bei { $pct } % des Grenzwerts
threshold-cathode-current = zu hoch über dem Höchstwert von { $max }
reason-cathode-current-over = Kathodenstrom { $current } ist { $pct } % des Höchstwerts
reason-cathode-current = Kathodenstrom ist { $pct } % des Höchstwerts

## Begründungen: Widerstände, Siebkondensatoren und die Gleichrichterröhre
## (src/calc/supply.rs). `place-…` sagen, wo ein Bauteil sitzt.

reason-dissipation = Verlustleistung { $watts }
reason-resistor-high-line = würde an der oberen Netzgrenze { $watts } umsetzen, { $pct } % des Nennwerts
reason-resistor-no-rating = setzt { $watts } um; keine Belastbarkeit angegeben
threshold-no-power-rating = keine: der Auftrag nennt keine Belastbarkeit
reason-not-measured = { $nodes } nicht gemessen
place-between = { $from } → { $to }
place-cathodes = { $count ->
        [one] Kathode { $valves }
       *[other] Kathoden { $valves }
    }
place-screen = Schirmgitter { $valve }
place-to-screen = { $node } → g2 { $valve }
reason-silicon-rectifier = Siliziumgleichrichter
reason-valve-rectifier = Gleichrichterröhre { $type }
reason-valve-rectifier-slow = Gleichrichterröhre { $type }, indirekt geheizt
reason-rectifier-not-stated = Gleichrichter nicht angegeben, als Silizium angenommen
reason-cap-peak-words = Einschaltspitze an der oberen Netzgrenze { $mains } ({ $rectifier })
reason-cap-work-words = Betriebsspannung an der oberen Netzgrenze { $mains }
threshold-capacitor = zu hoch über der Nennspannung von { $rating }; Vorsicht, wenn die Reserve unter { $margin } % liegt
reason-cap-unchecked = ; die Betriebsspannung wurde nicht geprüft: { $node } nicht gemessen
reason-cap-both-over = die { $peak }, { $peak_volts }, und die { $work }, { $work_volts }, übersteigen beide die Nennspannung von { $rating }
reason-cap-work-over = die { $work }, { $work_volts }, übersteigt die Nennspannung von { $rating }
reason-cap-work-over-peak = die { $work }, { $work_volts }, übersteigt die Nennspannung von { $rating } (die { $peak } erreicht { $peak_volts }; ein langsam anheizender Gleichrichter macht das weniger wahrscheinlich)
reason-cap-peak-slow = die { $peak }, { $highest }, übersteigt die Nennspannung von { $rating }; ein langsam anheizender Gleichrichter macht das weniger wahrscheinlich, aber nicht unmöglich
reason-cap-peak-over = die { $peak }, { $highest }, übersteigt die Nennspannung von { $rating }
reason-cap-margin-low = die { $source }, { $highest }, lässt nur { $margin } % Reserve zur Nennspannung von { $rating }
reason-cap-margin = höchste zu erwartende Spannung { $highest } ({ $source }) lässt { $margin } % Reserve
threshold-rectifier = Vorsicht über 90 % des Nennstroms von { $rating }, zu hoch über 100 % (nur die Endröhren: eine Untergrenze)
reason-rectifier = die Endröhren allein ziehen { $load } mA, { $pct } % der { $rating } mA, die { $type } { $position } liefern darf

## Begründungen: elektrische Sicherheitsprüfungen (src/calc/safety.rs).

safety-limit-with-cord = ≤ { $limit } + Leitung { $cord } = { $allowed }
safety-earth = Schutzleiterwiderstand { $ohms }
safety-insulation-limit = ≥ { $ohms } bei { $volts } DC
safety-insulation = Isolationswiderstand { $ohms } bei { $volts } DC
safety-leakage = Ableitstrom { $amps }
safety-meets = { $what } hält den Grenzwert { $limit } ein
safety-fails = { $what } verfehlt den Grenzwert { $limit }
safety-test-earth-continuity = Schutzleiter
safety-test-insulation = Isolation
safety-test-leakage = Ableitstrom

## Begründungen: Messungen am Prüfplatz (src/calc/bench.rs).

bench-at-clipping = am Beginn der Übersteuerung
bench-at-distortion = bei { $pct } % Klirrfaktor
bench-with-drive = bei { $volts } Ansteuerung
bench-power-into = { $watts } an { $load } { $condition }
bench-power-at-drive = { $power }; bei fester Ansteuerung gemessen, daher nicht gegen die Nennleistung bewertet
threshold-power-at-drive = keine: bewertet werden nur Messungen an der Übersteuerungsgrenze oder bei angegebenem Klirrfaktor
threshold-power = Vorsicht unter { $guide } % der Nennleistung von { $rated }
bench-power-below-guide = Ausgangsleistung { $power } ist { $pct } % der Nennleistung von { $rated }, unter dem Richtwert von { $guide } %
bench-power-of-rated = Ausgangsleistung { $power } ist { $pct } % der Nennleistung von { $rated }
bench-power-no-rating = Ausgangsleistung { $power }; der Auftrag nennt keine Nennleistung zum Vergleich
threshold-power-no-rating = keine: der Auftrag nennt keine Nennleistung
bench-hum-level-shorted = Brumm und Rauschen { $volts } ({ $dbv } dBV) bei kurzgeschlossenem Eingang
bench-hum-level-open = Brumm und Rauschen { $volts } ({ $dbv } dBV) bei offenem Eingang
threshold-hum = Vorsicht bei weniger als { $guide } dB unter Vollaussteuerung
bench-rated-full-output = der Nennleistung von { $watts }
bench-measured-full-output = der gemessenen Höchstleistung von { $watts }
bench-hum-below-guide = { $level } liegt nur { $db } dB unter { $against }, weniger als der Richtwert von { $guide } dB
bench-hum-below = { $level } liegt { $db } dB unter { $against }
bench-hum-no-full = { $level }; keine gemessene oder Nennleistung zum Vergleich
threshold-hum-no-full = keine: der Auftrag nennt weder eine gemessene Ausgangsleistung noch eine Nennleistung

## Die Prüfungen einer Röhre und wie ihr Ruhestrom bestimmt wurde
## (src/calc/findings.rs).

check-plate-dissipation = Anodenverlustleistung
check-plate-dissipation-high-line = Anodenverlustleistung an der oberen Netzgrenze
check-screen-dissipation = Schirmgitterverlustleistung
check-plate-voltage = Anodenspannung
check-screen-voltage = Schirmgitterspannung
check-cathode-current = Kathodenstrom
check-rectifier-load = Gleichrichterlast
method-shared-cathode-resistor = gemeinsamer Kathodenwiderstand
method-own-cathode-resistor = eigener Kathodenwiderstand
method-sense-resistor = Messwiderstand
method-transformer-resistance = Wicklungswiderstand
method-shunt = Shunt über der halben Primärwicklung
method-probe = Bias-Messadapter

## Der entscheidende Wert eines Status in wenigen Worten, für die
## Statusspalte der Tabellen (src/calc/brief.rs). `$pct` bringt sein „%“ mit.

brief-plate = Anode { $pct }
brief-plate-high-line = Anode { $pct } (Netz max.)
brief-screen = Schirmgitter { $pct }
brief-voltage-high-line = { $name } { $pct } (Netz max.)
brief-voltage-of-max = { $name } { $pct } v. Max.
brief-cathode-current = Ik { $pct } v. Max.
brief-from-chart = { $deviation } % zur Tabelle
brief-no-chart = kein Tabellenwert
brief-at-high-line = { $pct } % (Netz max.)
brief-of-rating = { $pct } % v. Nennwert
brief-no-rating = kein Nennwert angegeben
brief-working-high-line = Betrieb, Netz max.
brief-cold-start-peak = Einschaltspitze
brief-margin = { $pct } % Reserve
brief-volts-on-rating = { $volts } { $what } bei { $rating }
brief-margin-what = { $pct } % Reserve, { $what }
brief-of-rated = { $pct } % der Nennleistung
brief-below-full = { $db } dB unter Vollpegel
brief-against = { $measured } gegen { $limit }

## Warnungen und die Übersicht auf Seite 1 (src/calc/mod.rs): worum es bei
## einem Befund geht und die Zeile jeder Gruppe.

warn-subject-reason = { $subject }: { $reason }
warn-subject-safety = Sicherheit
warn-subject-sign-off = Abnahme
warn-subject-job = Auftrag
warn-subject-heater = Heizung
warn-subject-heater-labelled = Heizung { $label }
warn-subject-output-power = Ausgangsleistung
warn-subject-hum-noise = Brumm und Rauschen
warn-subject-on-channel = { $what } (Kanal { $channel })
warn-acceptance-unmatched = die Akzeptanz von { $what } trifft auf keinen Wert außerhalb seiner Grenzen und akzeptiert daher nichts
warn-accept-node = Messpunkt { $name }
warn-accept-heater = Heizung { $name }
warn-accept-heater-supply = die Heizversorgung
warn-accept-safety = die Prüfung { $name }
warn-accept-in-set = { $what } in „{ $set }“
warn-not-measured-final = { $what } ist in „{ $final }“, der letzten Messreihe, nicht gemessen (in „{ $set }“ schon)
warn-no-sets = Der Auftrag enthält keine Messreihen, daher konnten keine Werte berechnet werden.
warn-subject-network = Netzwerk
warn-network-problem = Das Netzwerk der Änderung „{ $what }“ ließ sich nicht berechnen: { $problem }.
warn-no-mu-ra = { $position } ({ $type }): die Datentabelle nennt keine typischen Werte μ und ra, daher fehlt der berechnete Wert der Stufe.
figure-rc-corner = { $ohms } mit { $farads }: Eckfrequenz { $frequency }
figure-cathode-bypass = { $valve } ({ $type }, μ { $mu }, ra { $ra }): Rk { $rk } überbrückt mit { $ck } an { $load } Last: Eckfrequenz { $frequency }
figure-gain-bypassed = { $valve } ({ $type }) an { $load }, Kathode überbrückt: Verstärkung etwa { $gain }
figure-gain-unbypassed = { $valve } ({ $type }) an { $load }, { $rk } nicht überbrückt: Verstärkung etwa { $gain }
figure-phase-shift = drei Glieder aus { $ohms } und { $farads }: etwa { $frequency } (die Stufe braucht eine Verstärkung von mindestens { $gain })
note-unknown-type = { $position }: der Röhrentyp { $type } steht nicht in der Datentabelle
note-not-checked = { $reference }: nicht geprüft, { $reason }
family-output-valves = Endröhren gegen ihre Grenzwerte
family-supply-voltages = Versorgungsspannungen gegen die Tabelle
family-stressed-parts = Belastete Widerstände, Kondensatoren und Gleichrichter
family-heater = Heizversorgung
family-bench-tests = Messungen am Prüfplatz
family-safety-tests = Elektrische Sicherheitsprüfungen
family-no-safety = keine Sicherheitsprüfungen festgehalten
family-no-bench = keine Messungen am Prüfplatz festgehalten
family-nothing-measured = nichts gemessen
family-check-of = { $check } von { $names }
family-accepted = vom Techniker akzeptiert: { $what } (Gründe unten)
family-safety-ok = { $count ->
        [one] die Prüfung hält ihren Grenzwert ein
       *[other] alle { $count } Prüfungen halten ihre Grenzwerte ein
    }
family-valves-ok = { $count ->
        [one] { $count } Endröhre innerhalb ihrer Grenzwerte
       *[other] { $count } Endröhren innerhalb ihrer Grenzwerte
    }; am heißesten { $hottest } mit { $pct } % ihrer Anodenverlustleistung
family-nodes-ok = { $count ->
        [one] { $count } Messpunkt
       *[other] { $count } Messpunkte
    } innerhalb der Toleranz zur Tabelle; größte Abweichung { $deviation } % an { $node }
family-busiest-resistor = am stärksten belasteter Widerstand { $reference } mit { $pct } % seines Nennwerts
family-least-margin = kleinste Kondensatorreserve { $pct } % ({ $reference })
family-rectifier-load = Gleichrichter { $position } mit { $pct } % seines Nennwerts
family-heater-ok = { $measured } gegen { $nominal } ({ $deviation } %)
family-bench-power = { $watts } W an { $load } { $condition }
family-bench-power-rated = { $watts } W an { $load } { $condition } ({ $pct } % der Nennleistung)
family-bench-hum-below = Brumm und Rauschen { $db } dB unter Vollaussteuerung
family-bench-hum = Brumm und Rauschen { $volts } ({ $dbv } dBV)
family-bench-response-both = −3 dB bei { $low } und { $high }
family-bench-response-low = −3 dB bei { $low }, innerhalb 3 dB bis { $high }
family-bench-response-high = innerhalb 3 dB ab { $low }, −3 dB bei { $high }
family-bench-response-flat = innerhalb 3 dB von { $low } bis { $high }
family-bench-gain = Verstärkung { $db } dB

## Hinweise zu Messwerten, die nicht verwendet werden konnten (src/calc).
## Jeder beginnt mit dem, worum es geht, und einem Doppelpunkt.

note-screen-above-supply = { $position }: das Schirmgitter zeigt { $screen }, seine Versorgung { $supply } aber { $volts }; der Schirmgitterstrom bleibt unberücksichtigt
note-no-idle-current = { $position }: kein Messwert ergibt den Ruhestrom (Kathoden-, Messwiderstands- oder Halbwicklungsspannung oder einen Strom messen)
note-no-half-primary = { $position }: ein Spannungsabfall an der Halbwicklung ist angegeben, aber die Schaltung nennt keinen Halbwicklungswiderstand für { $position }
note-no-sense-resistor = { $position }: eine Spannung am Messwiderstand ist angegeben, aber die Schaltung hat keinen Messwiderstand für { $position }

note-unfit-no-mu = die Datentabelle nennt kein { $factor } für { $type }
note-unfit-no-plate = es gibt keinen Messwert der Anodenspannung
note-unfit-no-screen = es gibt keinen Messwert der Schirmgitterspannung
note-unfit-no-current = kein Messwert ergibt den Ruhestrom
note-unfit-no-grid = es gibt keinen Messwert der Gitterspannung
note-unfit-cut-off = nach ihren Messwerten wäre die Röhre gesperrt oder genau an der Sperrgrenze, wenn man ihren Strom nach dem 3/2-Potenzgesetz rechnet (der Strom wächst mit der wirksamen Steuerspannung hoch 3/2; μ { $mu }), daher lässt sich dieses Gesetz nicht an sie anpassen
note-no-suggestion-figure = { $reference }: kein Vorschlag für den Kathodenwiderstand, da keine Röhre daran einen Wert der Anodenverlustleistung hat
note-no-suggestion-unfit = { $reference }: kein Vorschlag für den Kathodenwiderstand, da für { $valve } gilt: { $why }
note-no-suggestion-reach = { $reference }: nach dem 3/2-Potenzgesetz des Röhrenstroms bringt kein Kathodenwiderstand { $valve } auf { $pct } % der zulässigen Anodenverlustleistung

## Aufzählungen im Text: „V3, V4 und V5“.

list-and = { $first } und { $last }

## Diagnosen: Probleme in Auftragsdateien, Werkstattprofilen,
## Übersetzungsdateien und Fotos, in der Sprache des Werkstattprofils.
## `file` ist `job` oder `shop`; `what` ist ein schon gesagter Name.

diag-file-warnings = { $name }: { $warnings ->
        [one] 1 Warnung
       *[other] { $warnings } Warnungen
    }
diag-file-refused = { $name }: { $errors ->
        [one] 1 Problem verhindert
       *[other] { $errors } Probleme verhindern
    }, dass { $file ->
        [shop] dieses Werkstattprofil
        [translation] diese Übersetzungsdatei
       *[job] diese Auftragsdatei
    } gelesen wird
diag-file-refused-warnings = { $name }: { $errors ->
        [one] 1 Problem verhindert
       *[other] { $errors } Probleme verhindern
    }, dass { $file ->
        [shop] dieses Werkstattprofil
        [translation] diese Übersetzungsdatei
       *[job] diese Auftragsdatei
    } gelesen wird (außerdem { $warnings ->
        [one] 1 Warnung
       *[other] { $warnings } Warnungen
    })
diag-not-shown = { $count ->
        [one] 1 weiteres Problem wird
       *[other] { $count } weitere Probleme werden
    } nicht gezeigt: die { $shown } oben beheben und erneut starten
diag-allowed-here = hier erlaubt: { $names }
diag-did-you-mean = meinten Sie `{ $name }`?
diag-did-you-mean-either = meinten Sie { $names } oder `{ $last }`?
diag-in-job-file = der Auftragsdatei
diag-in-shop-profile = dem Werkstattprofil
diag-in-set = einer Messreihe
diag-unknown-node = unbekannter Knoten `{ $name }` in { $context }
diag-unknown-node-label = kein Knoten, den das Format hier kennt
diag-type-annotation = die Typangabe `({ $type })` wird in Auftragsdateien nicht verwendet
diag-remove-this = entfernen
diag-type-annotation-help = die Einheit stattdessen in den Wert schreiben, zum Beispiel "352V"
diag-takes-no-properties = `{ $node }` hat keine Eigenschaften
diag-unknown-property = unbekannte Eigenschaft `{ $key }` an `{ $node }`
diag-unknown-property-label = keine Eigenschaft dieses Knotens
diag-repeated-property = die Eigenschaft `{ $key }` steht zweimal an `{ $node }`
diag-repeated-here = hier wiederholt
diag-takes-no-values = `{ $node }` nimmt keine einfachen Werte; seine Eigenschaften verwenden
diag-takes-values = `{ $node }` nimmt { $count ->
        [one] 1 einfachen Wert
       *[other] { $count } einfache Werte
    }
diag-extra-value = unerwarteter Wert an `{ $node }`
diag-not-expected-here = hier nicht erwartet
diag-no-children = `{ $node }` hat keine Unterknoten
diag-missing = `{ $node }`: { $what } fehlt
diag-missing-label = { $what } fehlt
diag-for-example = zum Beispiel: { $example }
diag-a-property = eine Eigenschaft `{ $key }`
diag-found-text = der Text "{ $text }"
diag-found-number = die Zahl { $number }
diag-expected-text = { $what } muss Text sein, gefunden: { $found }
diag-expected-text-label = Text in Anführungszeichen erwartet
diag-expected-text-help = in doppelte Anführungszeichen setzen, zum Beispiel "{ $example }"
diag-expected-name = { $what } muss ein Name wie V1 oder B+1 sein, gefunden: { $found }
diag-expected-name-label = Name erwartet
diag-expected-bool = { $what } muss #true oder #false sein, gefunden: { $found }
diag-expected-bool-label = #true oder #false erwartet
diag-expected-bool-help = KDL 2 schreibt Wahrheitswerte als #true und #false
diag-expected-integer = { $what } muss eine ganze Zahl von { $low } bis { $high } sein
diag-expected-integer-label = ganze Zahl erwartet
diag-expected = erwartet: { $what }
diag-must-be-kind = { $what } muss { $kind } sein, gefunden: { $found }
diag-out-of-range-kind = { $what }: { $written } liegt außerhalb des zulässigen Bereichs ({ $kind }: { $range })
diag-out-of-range-help = kein Messwert und kein Bauteil hat diesen Wert; Vorsatz und Exponent prüfen
diag-this-value = dieser Wert
diag-bad-value = { $what }: { $problem }
diag-write-kind-as = so schreiben ({ $kind }): { $example }
diag-bad-time = { $what } muss eine Zeit seit dem Einschalten sein, höchstens ein Tag
diag-bad-time-label = Zeit wie "5min" erwartet
diag-bad-time-help = Minuten als Zahl (5) schreiben, oder als Text mit s, min oder h: "30s", "5min", "1.5h"
diag-date-not-text = { $what } muss ein Datum in Anführungszeichen sein, gefunden: { $found }
diag-date-label = "JJJJ-MM-TT" erwartet
diag-date-help = Daten als ISO-8601-Text schreiben, zum Beispiel "2026-11-02"
diag-bad-date = { $what } "{ $text }" ist kein gültiges Datum ({ $error })
diag-bad-date-help = Daten nach ISO 8601 als Jahr-Monat-Tag schreiben, zum Beispiel "2026-11-02"
diag-date-out-of-range = diesen Monat oder Tag gibt es nicht
diag-date-too-short = es endet, bevor das Datum vollständig ist
diag-date-too-long = nach dem Datum folgt noch etwas
diag-date-not-ymd = es ist nicht als Jahr-Monat-Tag geschrieben
diag-must-be-from = { $what } muss im Bereich { $range } liegen
diag-cannot-be-negative = { $what } kann nicht negativ sein
diag-cannot-be-zero = { $what } kann nicht null sein
diag-zero-or-more = null oder mehr erwartet
diag-more-than-zero = mehr als null erwartet
diag-impossible-help = ein echtes Bauteil oder Netzteil kann diesen Wert nicht haben; den Messwert prüfen
diag-leads-reversed-help = dieser Messwert kann nur mit vertauschten Messleitungen unter null liegen: ihn prüfen und, wenn sie vertauscht waren, ohne Minuszeichen eintragen
diag-range = { $low } bis { $high }
diag-kind-voltage = eine Spannung
diag-kind-current = ein Strom
diag-kind-resistance = ein Widerstand
diag-kind-power = eine Leistung
diag-kind-capacitance = eine Kapazität
diag-kind-inductance = eine Induktivität
diag-kind-frequency = eine Frequenz
diag-kind-percent = ein Prozentwert
diag-unit-empty = der Wert ist leer
diag-unit-not-a-number = das ist keine Zahl mit optionalem SI-Vorsatz oder RKM-Code
diag-unit-wrong = "{ $symbol }" ist eine Einheit für etwas anderes ({ $found }); hier gehört { $expected } hin
diag-unit-rkm = der RKM-Buchstabe R markiert das Komma eines Widerstands, hier gehört aber { $expected } hin
diag-unit-no-prefix = { $expected } nimmt keinen SI-Vorsatz
diag-unit-not-finite = der Wert ist zu groß für einen Messwert

diag-given-more-than-once = `{ $name }` steht mehr als einmal da
diag-merge-nodes = eine Auftragsdatei hat einen Knoten `{ $name }`; die Knoten zusammenführen
diag-format-too-new = diese Auftragsdatei verwendet Format { $found }, aber dieses ampreport liest höchstens Format { $known }
diag-format-version = Formatversion
diag-update-program = ampreport aktualisieren, um diese Datei zu lesen
diag-needs-version = `{ $name }` braucht die Versionsnummer
diag-version-missing = Version fehlt
diag-write-format = `job-format 1` schreiben
diag-no-format = die Auftragsdatei sagt nicht, welches Format sie verwendet
diag-start-of-file = Dateianfang
diag-begin-with-format = die Datei mit `job-format 1` beginnen
diag-is-shop-profile = das ist ein Werkstattprofil, keine Auftragsdatei
diag-is-ratings-file = das ist eine Datei mit Röhrendaten, keine Auftragsdatei
diag-not-a-job-file = keine Auftragsdatei
diag-is-shop-profile-help = ein Werkstattprofil wird von selbst gefunden (shop.kdl neben dem Auftrag oder in einem Ordner darüber) oder mit --shop DATEI genannt; hier die Auftragsdatei angeben
diag-is-ratings-file-help = eine Datei mit Röhrendaten wird mit --ratings DATEI genannt; hier die Auftragsdatei angeben
diag-no-node = die Auftragsdatei hat keinen Knoten `{ $name }`
diag-add = ergänzen: { $example }
diag-two-final-sets = mehr als eine Messreihe ist als `final` markiert
diag-second-final = eine zweite letzte Messreihe
diag-two-final-help = die letzte Messreihe ist der Zustand, in dem das Gerät übergeben wird: nur eine markieren
diag-repeated-set = es gibt zwei Messreihen mit der Bezeichnung "{ $label }"
diag-repeated-label = wiederholte Bezeichnung
diag-dates-out-of-order = der Auftrag ist abgeschlossen ({ $completed }), bevor er eingegangen ist ({ $received })
diag-completed-before = vor dem Eingang abgeschlossen
diag-given-twice = `{ $name }` steht zweimal da
diag-wide-tolerance = eine Toleranz der Versorgung von { $pct }% ist ungewöhnlich weit
diag-unusual = ungewöhnlich
diag-unusual-mains = { $volts } V ist keine übliche Netzspannung
diag-unusual-mains-label = ungewöhnliche Nennspannung
diag-unknown-role = unbekannte Röhrenfunktion `{ $name }`
diag-expected-role = Funktion erwartet
diag-valve-needs-role = `valve` braucht eine Eigenschaft `role`
diag-role-missing = Funktion fehlt
diag-one-of = eines von: { $names }
diag-position-twice = die Röhrenposition { $position } steht zweimal da
diag-unknown-bias = unbekannte Vorspannungsart `{ $name }`
diag-expected-bias = cathode oder fixed erwartet
diag-large-sense = ein Messwiderstand von { $value } ist ungewöhnlich groß
diag-sense-help = Messwiderstände haben meist 1 Ω oder 10 Ω
diag-node-declared-twice = der Knoten { $name } ist zweimal angegeben
diag-needs-voltage = `{ $name }` braucht die gemessene Spannung
diag-voltage-missing = Spannung fehlt
diag-node-read-twice = der Knoten { $name } ist in dieser Messreihe zweimal gemessen
diag-type-twice = der Typ von { $position } steht in dieser Messreihe zweimal da
diag-valve-read-twice = die Röhre { $position } ist in dieser Messreihe zweimal gemessen
diag-warm-up-help = Messwerte zu Zeitpunkten während des Aufwärmens gehören in einen Block `warm-up` mit `after=`
diag-warm-up-type = ein Messwert beim Aufwärmen kann den Röhrentyp nicht ändern
diag-not-here = nicht hier
diag-warm-up-type-help = den Typ der Messreihe in ihrer eigenen Zeile `valve` angeben
diag-warm-up-time = ein Messwert beim Aufwärmen braucht die Zeit seit dem Einschalten
diag-time-missing = Zeit fehlt
diag-warm-up-nothing = ein Messwert beim Aufwärmen braucht etwas Gemessenes (cathode, sense, primary-drop oder current)
diag-nothing-read = nichts gemessen
diag-read-twice-same-time = { $position } ist zweimal zur selben Zeit gemessen
diag-unknown-method = unbekannte Strommessart `{ $name }`
diag-expected-method = probe oder shunt erwartet
diag-method-help = probe: ein Messadapter unter der Röhre (Kathodenstrom); shunt: ein Strommesser über der halben Primärwicklung (Anodenstrom)
diag-current-needs-method = ein direkt gemessener Strom braucht seine Messart
diag-method-missing = Messart fehlt
diag-add-method = method=probe (Messadapter: Kathodenstrom) oder method=shunt (Nebenschluss über der halben Primärwicklung: Anodenstrom) ergänzen
diag-method-without-current = `method` steht ohne `current` da
diag-no-current = kein Strom dazu

diag-undeclared-node = der Knoten { $name } in „{ $set }“ ist nicht in `circuit` angegeben; er hat daher keinen Sollwert, und kein Bauteil verwendet ihn
diag-not-declared-node = kein angegebener Knoten
diag-declare-node-or = meinten Sie `{ $near }`? Sonst in `circuit` angeben: node { $name } chart="…"
diag-declare-node = in `circuit` angeben: node { $name } chart="…"
diag-node-only-here = der Knoten { $name } ist nur in „{ $set }“ gemessen; eine andere Messreihe misst { $near }
diag-different-name = ein anderer Name als in den übrigen Messreihen
diag-node-named = Knoten { $name }
diag-not-in-final = { $what } ist in „{ $final }“, der letzten Messreihe, nicht gemessen (wohl aber in „{ $set }“)
diag-not-measured-in = nicht gemessen in „{ $final }“
diag-read-again = in „{ $final }“ erneut messen, sonst kann das Protokoll nicht sagen, wie es beim Verlassen der Werkstatt steht
diag-mains-far = die Netzspannung von { $mains } in "{ $set }" weicht um { $pct }% von der Nennspannung { $nominal } ab
diag-far-from-nominal = weit von der Nennspannung
diag-mains-far-help = den Messwert prüfen, oder ob das Gerät an einem Stelltransformator lief
diag-output-role-mismatch = { $position } ist als Endröhre angegeben, aber die Datentabelle führt { $type } als { $class }
diag-unusual-role = ungewöhnliche Funktion für diesen Typ
diag-rectifier-mismatch = { $position } ist als Gleichrichter angegeben, aber die Datentabelle führt { $type } als { $class }
diag-not-a-rectifier = kein Gleichrichter
diag-unknown-valve-type = unbekannter Röhrentyp "{ $type }" an { $position }
diag-not-in-ratings = nicht in der Datentabelle
diag-rectifier-not-rectifier = der Gleichrichter ist { $position } ({ $type }), das ist keine Gleichrichterröhre
diag-write-silicon = für einen Halbleitergleichrichter `rectifier silicon` schreiben
diag-incomplete = { $file ->
        [shop] das Werkstattprofil
        [translation] die Übersetzungsdatei
       *[job] die Auftragsdatei
    } ist unvollständig
diag-here = hier
diag-bare-value = KDL-Syntax: `{ $value }` ist keine Zahl und muss daher in Anführungszeichen stehen
diag-needs-quotes = braucht Anführungszeichen
diag-bare-value-help = "{ $value }" schreiben: ein Wert mit Einheit oder ein Name, der mit einer Ziffer beginnt, ist Text in doppelten Anführungszeichen
diag-kdl-syntax = KDL-Syntax: { $problem }
diag-kdl-broken = die KDL-Syntax ist hier fehlerhaft
diag-kdl-help = Auftragsdateien sind KDL 2.0: Text in doppelten Anführungszeichen, Wahrheitswerte als #true/#false, ein Knoten pro Zeile

diag-merge-shop-nodes = ein Werkstattprofil hat einen Knoten `{ $name }`; die Knoten zusammenführen
diag-shop-no-format = das Werkstattprofil sagt nicht, welches Format es verwendet
diag-begin-with-shop-format = die Datei mit `shop-format 1` beginnen
diag-shop-no-node = das Werkstattprofil hat keinen Knoten `{ $name }`
diag-logo-name-empty = der Dateiname des Logos ist leer
diag-expected-file-name = Dateiname erwartet
diag-bad-pattern = das Muster für Auftragsnummern `{ $pattern }` ist nicht verwendbar: { $why }
diag-expected-pattern = Muster wie D-{"{"}yymm{"}"}-{"{"}nnn{"}"} erwartet
diag-pattern-help = Bausteine: {"{"}yyyy{"}"} {"{"}yy{"}"} {"{"}mm{"}"} {"{"}dd{"}"} {"{"}yymm{"}"} und ein Zähler {"{"}n…{"}"} (ein n pro Ziffer)
diag-not-language-tag = `{ $tag }` ist kein Sprachkürzel
diag-expected-language-tag = Sprachkürzel wie en oder de erwartet
diag-built-in-languages = eingebaut: { $tags }
diag-no-catalogue = das Programm hat keinen Katalog für `{ $tag }` eingebaut
diag-no-built-in-catalogue = kein eingebauter Katalog
diag-own-translation = { $suggestion }; oder eine eigene Übersetzung angeben: language "{ $tag }" file="{ $tag }.ftl"
diag-shop-format-too-new = dieses Werkstattprofil verwendet Format { $found }, aber dieses ampreport liest höchstens Format { $known }
diag-write-shop-format = `shop-format 1` schreiben
diag-shop-name-empty = der Name der Werkstatt ist leer
diag-expected-the-name = Name erwartet
diag-unknown-paper = unbekanntes Papierformat `{ $name }`
diag-expected-paper = a4 oder letter erwartet
diag-bad-period = `period` "{ $text }" ist keine Zeitdauer
diag-expected-period = eine Zahl und days, weeks, months oder years erwartet
diag-period-help = zum Beispiel period="90 days", "6 months" oder "1 year"

diag-charges-currency = `charges` braucht eine Währung
diag-currency-missing = Währung fehlt
diag-charges-currency-help = charges currency="GBP" {"{"} … {"}"} schreiben, oder die Währung im Knoten `charges` des Werkstattprofils festlegen
diag-charges-too-large = die Kosten sind zu groß, um sie zu addieren
diag-these-charges = diese Kosten
diag-charge-both = eine Zeile mit `amount` nimmt kein `{ $count }` und kein `{ $price }`
diag-charge-both-label = dies entfernen, oder den Betrag
diag-charge-both-help = entweder amount="…" oder { $count }=… { $price }="…" schreiben
diag-labour-needs = `hours` und `rate`, oder einen Betrag `amount`
diag-part-needs = einen Preis `price` (und eine Menge `quantity`), oder einen Betrag `amount`
diag-amount-missing = Betrag fehlt
diag-currency-code = `currency` muss ein kurzes Kürzel oder Zeichen sein (1 bis 8 Zeichen)
diag-expected-currency = Währung erwartet
diag-currency-help = zum Beispiel currency="GBP", "EUR", "USD" oder "€"
diag-tax-rate = `tax-rate` muss ein Prozentsatz von 0% bis 100% sein, gefunden: `{ $found }`
diag-expected-percentage = Prozentsatz erwartet
diag-tax-rate-help = zum Beispiel tax-rate="20%" oder tax-rate="8.875%"
diag-charges-no-sign = Kostenzeilen werden addiert; den Betrag ohne Vorzeichen schreiben
diag-money-too-large = { $what } ist zu groß (die Grenze ist { $limit })
diag-too-large = zu groß
diag-too-many-places = { $what } hat mehr als { $places } Nachkommastellen
diag-too-many-decimals = zu viele Nachkommastellen
diag-plain-decimal = { $what } muss eine einfache Dezimalzahl sein, gefunden: `{ $found }`
diag-expected-money = Zahl wie 48.00 erwartet
diag-money-help = Beträge und Stunden mit Dezimalpunkt und ohne Währungszeichen oder Tausendertrennzeichen schreiben, zum Beispiel "1250.00"
diag-expected-a-number = Zahl erwartet

diag-photo-absolute = das Foto `{ $path }` ist ein absoluter Pfad
diag-photo-outside = das Foto `{ $path }` ist kein Pfad im Ordner des Auftrags
diag-photo-relative = Pfad relativ zur Auftragsdatei erwartet
diag-photo-keep-inside = Fotos im Ordner des Auftrags oder darunter ablegen und von dort aus benennen, zum Beispiel photo "photos/chassis.jpg"
diag-photo-link = das Foto `{ $path }` ist eine Verknüpfung, die aus dem Ordner des Auftrags hinausführt (nach { $target })
diag-leads-outside = führt hinaus
diag-photo-copy = das Foto in den Ordner des Auftrags kopieren, statt darauf zu verweisen
diag-photo-not-file = das Foto { $path } ist keine gewöhnliche Datei
diag-not-a-file = keine Datei
diag-photo-png-jpeg = ein Foto muss eine PNG- oder JPEG-Datei sein
diag-photo-too-large = das Foto { $path } hat { $size } MB; die Grenze ist { $limit } MB
diag-photo-smaller = das Foto kleiner exportieren (das Protokoll druckt es etwa 8 cm breit; 2000 Pixel Breite genügen)
diag-photo-cannot-read = das Foto { $path } kann nicht gelesen werden: { $error }
diag-this-file = diese Datei
diag-photo-check-path = den Pfad prüfen: er ist relativ zum Ordner der Auftragsdatei
diag-photo-not-image = das Foto { $path } ist kein PNG- oder JPEG-Bild (sein Inhalt ist { $content ->
        [empty] leer
        [text] Text
       *[other] keines von beiden
    })
diag-not-a-picture = kein Bild
diag-photo-content-matters = ein Foto muss eine PNG- oder JPEG-Datei sein; es zählt nicht die Endung des Namens, sondern der Inhalt
diag-photo-undecodable = das Foto { $path } { $why }
diag-photo-save-again = das Foto in einem Bildprogramm öffnen und erneut als PNG oder JPEG speichern

diag-part-needs-reference = `part` braucht eine Schaltungsbezeichnung oder `what=`
diag-which-part = welches Bauteil?
diag-second-network = eine Änderung hat ein `network`; dies ist ein zweites
diag-unknown-class = unbekannte Schutzklasse `{ $name }`
diag-expected-class = I oder II erwartet
diag-needs-reading = `{ $name }` braucht den Messwert
diag-reading-missing = Messwert fehlt
diag-unknown-safety-test = unbekannte Sicherheitsprüfung `{ $name }`
diag-not-a-safety-test = keine Sicherheitsprüfung
diag-unknown-check = unbekannte Röhrenprüfung `{ $name }`
diag-not-a-check = keine Prüfung
diag-empty-reason = eine Akzeptanz braucht ihre Begründung in Worten
diag-empty-reason-label = leere Begründung
diag-acceptance-who = eine Akzeptanz braucht den Namen des Technikers, der akzeptiert hat
diag-who-accepted = wer hat das akzeptiert?
diag-acceptance-when = eine Akzeptanz braucht das Datum, an dem akzeptiert wurde
diag-when-accepted = wann wurde das akzeptiert?
diag-needs-value = `{ $name }` braucht einen Wert
diag-value-missing = Wert fehlt

## Die eigenen Worte des KDL-Parsers, soweit das Programm sie kennt
## (src/job/kdl_words.rs). Unbekannte Worte des Parsers bleiben, wie er
## sie schrieb.

diag-kdl-expected = erwartet: { $what }
diag-kdl-not = hier gehört { $what } hin
diag-kdl-end-of-document = erwartet: das Ende der Datei
diag-kdl-no-closing-brace = der Block der Unterknoten wird nicht mit `{"}"}` geschlossen
diag-kdl-newline-in-string = ein Zeilenumbruch in einer einzeiligen Zeichenkette in Anführungszeichen
diag-kdl-no-closing-quote = das schließende Anführungszeichen einer Zeichenkette fehlt
diag-kdl-no-closing-quotes = die schließenden Anführungszeichen einer mehrzeiligen Zeichenkette fehlen
diag-kdl-multiline-prefix = jede Zeile einer mehrzeiligen Zeichenkette muss mit der Einrückung der schließenden Zeile beginnen
diag-kdl-bad-node-name = das kann kein Knotenname sein
diag-kdl-block-without-name = ein Block von Unterknoten, wo ein Knotenname hingehört
diag-kdl-bad-fraction = ein Zeichen nach dem `.` einer Zahl, das keine Ziffer ist
diag-kdl-bad-exponent = ein Zeichen im Exponenten einer Zahl, das keine Ziffer ist
diag-kdl-bad-type-annotation = die Typangabe enthält etwas, das sie nicht enthalten darf
diag-kdl-raw-string-shape = eine einzeilige Rohzeichenkette darf nicht wie eine mehrzeilige aussehen
diag-kdl-negative-unsigned = eine negative Zahl, wo eine Zahl ohne Vorzeichen hingehört
diag-kdl-thing-node-name = ein Knotenname
diag-kdl-thing-identifier = ein Name
diag-kdl-thing-quoted-string = eine Zeichenkette in Anführungszeichen
diag-kdl-thing-raw-string = eine Rohzeichenkette
diag-kdl-thing-multiline-string = eine mehrzeilige Zeichenkette
diag-kdl-thing-property-value = ein Wert einer Eigenschaft
diag-kdl-thing-type-name = ein Typname
diag-kdl-thing-keyword = ein Schlüsselwort
diag-kdl-thing-integer = eine ganze Zahl
diag-kdl-thing-float = eine Dezimalzahl
diag-kdl-thing-binary = eine Binärzahl
diag-kdl-thing-octal = eine Oktalzahl
diag-kdl-thing-hexadecimal = eine Hexadezimalzahl
diag-kdl-thing-newline = ein Zeilenumbruch
diag-kdl-thing-end = das Ende der Datei
diag-kdl-thing-comment-end = das Ende eines mehrzeiligen Kommentars
diag-kdl-thing-closing-quotes = die schließenden Anführungszeichen
diag-kdl-thing-unicode-escape = eine Unicode-Escape-Sequenz
diag-kdl-help-escape = etwas vergessen zu maskieren?
diag-kdl-help-node-name = den Namen des Knotens vergessen, oder den Knoten vor seinem Block von Unterknoten beendet?
diag-kdl-help-terminator = ein Wert wurde zum Teil gelesen, endet hier aber nicht; war ein Leerzeichen gemeint?
diag-kdl-help-exponent = eine Zahl mit Exponent sieht aus wie 2.0e123 oder 43.3E-4
diag-kdl-help-string = jede Art von Zeichenkette ist möglich: in Anführungszeichen, roh, mehrzeilig oder ein einfacher Name

## Diagnosen des `network`-Blocks einer Modifikation (src/job/network/decode.rs).

diag-in-a-node = einem `{ $node }`
diag-what-reference = eine Bauteilbezeichnung
diag-net-label = die Bezeichnung des Netzwerks
diag-net-needs-source = ein `network` braucht eine `source`
diag-net-source-missing = Quelle fehlt
diag-net-needs-load = ein `network` braucht eine `load`: den Knoten, an dem der Frequenzgang abgelesen wird
diag-net-load-missing = Last fehlt
diag-net-speed-not-pot = der Geschwindigkeitsregler { $name } ist kein Potentiometer dieses Netzwerks
diag-net-no-such-pot = kein solches Potentiometer
diag-net-add-speed-pot = das Geschwindigkeitspotentiometer als `pot REF value=… ccw=… wiper=…` hinzufügen
diag-net-one-node = ein Netzwerk hat ein `{ $node }`; dies ist ein zweites
diag-net-part-twice = das Netzwerk hat bereits ein Bauteil { $name }
diag-net-repeated-reference = wiederholte Bezeichnung
diag-net-own-reference = jedem Bauteil eine eigene Bezeichnung geben
diag-net-not-ground = `{ $name }` ist in einer Auftragsdatei nicht der Name des Bezugsknotens
diag-net-write-ground = `ground` schreiben
diag-net-ground-help = der Bezugsknoten (Masse) eines Netzwerks wird `ground` geschrieben
diag-net-impedance-no-valve = eine Quelle mit angegebener `impedance` nimmt keine Röhrenwerte
diag-net-not-with-impedance = nicht zusammen mit `impedance`
diag-net-impedance-or-valve = entweder `impedance=` angeben oder `valve=` mit `plate-load=`
diag-net-source-impedance = eine Quellimpedanz
diag-net-valve-and-impedance = eine Quelle ist entweder eine Röhrenstufe oder hat eine angegebene `impedance`, nicht beides
diag-net-remove-one = eines entfernen
diag-net-valve-impedance-help = der Ausgangswiderstand der Röhre ergibt sich aus ihrem Innenwiderstand ra und dem Anodenwiderstand
diag-net-plate-load = ein Anodenwiderstand
diag-net-cathode-resistor = ein Kathodenwiderstand
diag-net-needs-valve = ein Anoden- oder Kathodenwiderstand braucht das `valve=` der Quelle
diag-net-no-valve-named = keine Röhre genannt
diag-net-load-resistance = ein Lastwiderstand
diag-net-track-resistance = der Bahnwiderstand eines Potentiometers
diag-net-pot-needs-end = bei einem Potentiometer muss mindestens ein Ende der Widerstandsbahn angeschlossen sein (`ccw=` oder `cw=`)
diag-net-no-end = kein Ende angeschlossen
diag-net-pot-needs-setting = ein Potentiometer braucht die Stellung seines Schleifers, `setting` (0 bis 10; mehrere sind möglich, "3 7")
diag-net-setting-missing = Stellung fehlt
diag-net-same-node = { $part } verbindet den Knoten `{ $name }` mit sich selbst
diag-net-same-node-label = zweimal derselbe Knoten
diag-net-same-node-help = jeder Anschluss eines Bauteils geht an einen anderen Knoten
diag-net-unknown-taper = unbekannte Kennlinie `{ $name }` eines Potentiometers
diag-net-expected-taper = linear oder audio (logarithmisch) erwartet
diag-net-bad-setting = die Stellung eines Potentiometers reicht von 0 bis 10, gefunden: { $found }
diag-net-expected-setting = 0 bis 10 erwartet
diag-net-setting-help = eine Stellung schreiben, setting=5, oder mehrere in Anführungszeichen, setting="3 7"
diag-net-found-word = `{ $word }`
diag-net-found-nothing = nichts
diag-net-too-many-settings = ein Potentiometer kann höchstens { $max } Stellungen nennen, gefunden: { $count }
diag-net-too-many = zu viele
diag-net-part-reference = die Bezeichnung eines Bauteils
diag-net-no-part-to-change = das Netzwerk hat kein Bauteil { $name }, das geändert werden könnte
diag-net-no-part-to-remove = das Netzwerk hat kein Bauteil { $name }, das entfernt werden könnte
diag-net-no-such-part = kein solches Bauteil
diag-net-no-parts-yet = das Netzwerk hat noch keine Bauteile
diag-net-fit-new-part = { $suggestion }; ein neues Bauteil als `resistor { $name } value=… from=… to=…` schreiben (oder capacitor, inductor, link, pot)
diag-net-link-no-value = { $name } ist eine Brücke und hat keinen Wert
diag-net-not-for-link = nicht für eine Brücke
diag-net-not-a-pot = { $name } ist kein Potentiometer und hat daher kein `{ $key }`
diag-net-only-pots = nur für Potentiometer
diag-net-nothing-to-change = `change { $name }` ändert nichts
diag-net-nothing-changed = nichts geändert
diag-net-give-pot-change = `value=`, `setting=` oder `taper=` angeben
diag-net-give-value = den neuen Wert `value=` angeben
diag-net-change-or-replace = zum Ändern `change { $name } value=…` schreiben; zum Ersetzen zuerst `remove { $name }`
diag-net-empty-after = der `after`-Block ändert nichts
diag-net-no-edits = keine Änderungen
diag-net-empty-after-help = die Änderungen schreiben, die das Netzwerk in den Zustand bei Rückgabe bringen: change, remove oder ein neues Bauteil

## Diagnosen zur Gestalt eines Netzwerks (src/job/network/check.rs).
## `after` ist `yes` für das Netzwerk nach den Änderungen der Modifikation.

diag-list-pair = { $first } und { $last }
diag-list-more = { $first }, { $rest }
diag-net-settings-before-after = das Netzwerk nennt vorher { $before } und nachher { $after } Stellungen; die Kurven werden Stellung für Stellung verglichen
diag-net-settings-differ = die Stellungen passen nicht zueinander
diag-net-settings-before-after-help = vorher und nachher gleich viele Stellungen nennen (oder eine)
diag-net-speed-removed = das Geschwindigkeitspotentiometer { $name } wird durch die Änderungen der Modifikation entfernt
diag-net-not-as-left = nicht im Netzwerk bei Rückgabe
diag-net-no-mu-ra = für { $position } ({ $type }) stehen keine typischen Werte für μ und ra in der Grenzwerttabelle, daher lässt sich der Ausgangswiderstand nicht berechnen
diag-net-no-mu-ra-label = kein μ und ra
diag-net-no-mu-ra-help = stattdessen `impedance=` an der Quelle angeben, oder μ und ra in der Zeile der Grenzwerttabelle ergänzen (--ratings)
diag-net-the-source = die Quelle
diag-net-the-load = die Last
diag-net-pot-end = { $name } ({ $side }-Ende bis Schleifer)
diag-net-source-on-ground = die Quelle kann nicht auf `ground` liegen: sie treibt einen Knoten gegen Masse
diag-net-source-on-ground-label = Quelle auf Masse
diag-net-load-on-ground = der Frequenzgang kann nicht an `ground` abgelesen werden: den Knoten nennen, an dem die Last hängt
diag-net-load-on-ground-label = Last auf Masse
diag-net-ideal-loop = { $parts } bilden{ $after ->
        [yes] {" "}nach den Änderungen der Modifikation
       *[no] {""}
    } eine Schleife idealer Verbindungen{ $shorted ->
        [yes] {" "}(die ideale Quelle ist kurzgeschlossen)
       *[no] {""}
    }: das Netzwerk lässt sich nicht berechnen
diag-net-closes-loop = schließt eine Schleife
diag-net-shorted-source-help = der Quelle ihren Ausgangswiderstand `impedance=` oder ein `valve=` geben, oder die Brücke entfernen, die sie kurzschließt
diag-net-ideal-loop-help = eine der Brücken entfernen: zwei ideale Wege zwischen denselben Knoten sagen nicht mehr als einer
diag-net-floating = { $count ->
        [one] Knoten { $nodes } ist
       *[other] Knoten { $nodes } sind
    }{ $after ->
        [yes] {" "}nach den Änderungen der Modifikation
       *[no] {""}
    } mit nichts verbunden, das Masse erreicht (nur { $parts }): das Netzwerk lässt sich nicht berechnen
diag-net-floating-label = offen (ohne Verbindung)
diag-net-floating-help = { $count ->
        [one] ihn
       *[other] sie
    } mit dem übrigen Netzwerk verbinden, oder die Knotennamen auf Tippfehler prüfen
diag-net-load-unreached = { $after ->
        [yes] nach den Änderungen der Modifikation führt
       *[no] es führt
    } kein Bauteil vom Knoten der Quelle `{ $source }` zum Knoten der Last `{ $load }`, daher ist der Frequenzgang null
diag-net-load-unreached-label = von der Quelle aus nicht erreicht
diag-net-load-unreached-help = die Knotennamen der Bauteile dazwischen prüfen
diag-net-pot-settings-differ = { $pot } nennt { $count } Stellungen, { $first } aber { $first_count }{ $after ->
        [yes] {" "}(nach den Änderungen der Modifikation)
       *[no] {""}
    }: die k-te Stellung jedes Potentiometers ergibt die k-te Stellung des Netzwerks
diag-net-pot-settings-help = an jedem Potentiometer gleich viele Stellungen nennen, oder eine Stellung für ein Potentiometer, das unverändert bleibt

## Diagnosen der Prüfstandsmessungen (src/job/decode_bench.rs).

diag-two-hints = { $first }; { $second }
diag-out-of-range = außerhalb des Bereichs
diag-bench-a-frequency = eine Frequenz
diag-bench-load-resistance = der Lastwiderstand
diag-bench-unusual-load = eine Kunstlast von { $load } ist ungewöhnlich
diag-bench-unusual-load-help = Kunstlasten haben meist 4 Ω, 8 Ω oder 16 Ω, die Lautsprecherimpedanz
diag-bench-rms-and-pp = `output-power` nennt sowohl `rms` als auch `peak-to-peak`
diag-bench-one-reading = nur ein Messwert
diag-bench-rms-or-pp = den Messwert nur einmal angeben: rms="15.5V" oder peak-to-peak="44V"
diag-bench-power-needs-volts = `output-power` braucht die Ausgangsspannung, mit Angabe, ob Effektivwert (RMS) oder Spitze-Spitze
diag-bench-the-output-voltage = die Ausgangsspannung
diag-bench-an-output-voltage = eine Ausgangsspannung
diag-bench-unusual-power = { $volts } an { $load } ergäben { $watts } W, ungewöhnlich für einen Röhrenverstärker
diag-bench-unusual-power-help = den Messwert, seine Art (rms oder peak-to-peak) und die Last prüfen
diag-bench-at-help = at=clipping (Einsetzen der Begrenzung), einen Klirrfaktor wie at="5%" oder die Eingangsspannung wie at="0.5V" schreiben
diag-bench-needs-at = `output-power` braucht die Bedingung, unter der gemessen wurde (`at=`)
diag-bench-condition-missing = Bedingung fehlt
diag-bench-the-distortion = der Klirrfaktor
diag-bench-distortion-range = ein Klirrfaktor muss über 0 % und unter 100 % liegen
diag-bench-the-input-drive = die Eingangsspannung
diag-bench-an-input-drive = eine Eingangsspannung
diag-bench-bad-at = `at` muss clipping, ein Klirrfaktor oder eine Eingangsspannung sein, gefunden: { $found }
diag-bench-expected-at = clipping, "5%" oder "0.5V" erwartet
diag-bench-the-hum-reading = der Messwert für Brumm und Rauschen
diag-bench-hum-needs-volts = `hum-noise` braucht die an der Last gemessene Effektivspannung
diag-bench-a-hum-reading = ein Messwert für Brumm und Rauschen
diag-bench-hum-high = { $volts } Brumm und Rauschen sind sehr hoch
diag-bench-hum-high-help = Brumm und Rauschen werden meist in Millivolt gemessen, zum Beispiel "4.2mV"
diag-bench-bad-input = `input` muss shorted (kurzgeschlossen) oder open (offen) sein, gefunden: { $found }
diag-bench-expected-input = shorted oder open erwartet
diag-bench-hum-needs-input = `hum-noise` muss angeben, ob der Eingang kurzgeschlossen oder offen war
diag-bench-input-missing = Zustand des Eingangs fehlt
diag-bench-an-input-level = ein Eingangspegel
diag-bench-point-needs = `point` braucht eine Frequenz und die dort gemessene Ausgangsspannung
diag-bench-the-frequency = die Frequenz
diag-bench-response-voltage = eine Ausgangsspannung eines Frequenzgangs
diag-bench-point-twice = { $frequency } wird in diesem Frequenzgang zweimal gemessen
diag-bench-response-empty = `response` enthält keine Messwerte
diag-bench-no-points = keine `point`-Unterknoten
diag-bench-no-reference-point = der Frequenzgang hat keinen Messwert bei seiner Bezugsfrequenz { $frequency }
diag-bench-no-point-here = hier kein Messpunkt
diag-bench-no-reference-point-help = einen `point` bei der Bezugsfrequenz ergänzen oder reference= auf eine gemessene Frequenz setzen
diag-bench-an-input-voltage = eine Eingangsspannung

## Diagnosen der Blöcke einer Auftragsdatei (src/job/decode.rs). `diag-what-…`
## nennen, was ein Wert ist (im Nominativ), für Meldungen wie
## `diag-cannot-be-negative`.

diag-what-job-format = die Formatversion der Auftragsdatei
diag-what-rated-power = die Nennausgangsleistung
diag-what-nominal-mains = die Nennnetzspannung
diag-what-mains-frequency = die Netzfrequenz
diag-what-design-mains = die Netzspannung, für die das Gerät ausgelegt ist
diag-what-supply-tolerance = die Toleranz der Netzspannung
diag-what-position = eine Position
diag-what-bias-kind = die Art der Gittervorspannung
diag-what-the-reference = die Bauteilbezeichnung
diag-what-node-name = ein Knotenname
diag-what-chart-voltage = die Spannung laut Schaltplan
diag-what-voltage-rating = eine Nennspannung
diag-what-winding-voltage = die Wicklungsspannung
diag-what-primary-voltage = die Primärspannung
diag-what-rectifier = `silicon` oder die Position der Gleichrichterröhre
diag-what-rectifier-drop = der Spannungsabfall am Gleichrichter
diag-what-set-label = eine Bezeichnung wie "as found"
diag-what-mains-voltage = die Netzspannung
diag-what-node-and-voltage = ein Knotenname und seine Spannung
diag-what-node-voltage = die Knotenspannung
diag-what-control-position = die Stellung des Reglers
diag-what-heater-voltage = die Heizspannung
diag-what-a-heater-voltage = eine Heizspannung
diag-what-heater-nominal = die Nennheizspannung
diag-what-valve-position = eine Röhrenposition
diag-what-valve-current = ein Röhrenstrom
diag-what-plate-voltage = die Anodenspannung
diag-what-screen-voltage = die Schirmgitterspannung
diag-what-cathode-voltage = die Kathodenspannung
diag-what-sense-voltage = die Spannung am Messwiderstand
diag-what-primary-drop = der Spannungsabfall über der halben Primärwicklung
diag-what-description = eine Beschreibung
diag-what-reading = der Messwert
diag-what-cord-resistance = der Widerstand der Netzleitung
diag-what-safety-test = der Name der Sicherheitsprüfung
diag-what-bench-test = der Name der Prüfstandsmessung
diag-what-part-reference = eine Bauteilbezeichnung
diag-what-photo-path = der Pfad des Fotos
diag-what-power-rating = eine Nennbelastbarkeit
diag-what-tolerance = eine Toleranz
diag-unusually-high = { $value } ist für einen Röhrenverstärker ungewöhnlich hoch
diag-part-example = zum Beispiel: part C10 was="…" now="…"   oder   part what="Netzkabel" was="zweiadrig" now="dreiadrig"
diag-second-network-help = ein zweites Netzwerk unter eine eigene Modifikation schreiben
diag-no-over-range = `{ $name }` nimmt keinen Messwert über dem Messbereich (">…")
diag-no-over-range-label = nur die Isolationsprüfung liest „mehr als“
diag-no-over-range-help = den Wert schreiben, den das Messgerät anzeigte, zum Beispiel: { $example }
diag-over-range-not-resistance = der Messwert über dem Messbereich ">{ $rest }" ist kein Widerstand
diag-over-range-expected = ">500M" erwartet
diag-over-range-help = den Endwert des Messgeräts nach `>` schreiben, zum Beispiel ">500M"
diag-key-missing = `{ $key }` fehlt
diag-safety-default-help = zum Beispiel: { $example }; oder einen Vorgabewert für `{ $key }` im `safety`-Block des Werkstattprofils setzen
diag-unknown-bench-test = unbekannte Prüfstandsmessung `{ $name }` zum Akzeptieren
diag-not-a-bench-test = keine Prüfstandsmessung mit Grenzwert
diag-empty-reason-help = begründen, warum der Wert annehmbar ist, zum Beispiel "Auslegung des Herstellers"
diag-acceptance-who-help = `by="…"` hier oder an `accepted` schreiben, oder dem Auftrag einen `technician=` geben
diag-acceptance-when-help = `date="YYYY-MM-DD"` hier oder an `accepted` schreiben, oder dem Auftrag ein `completed=`-Datum geben
diag-setting-range = `{ $name }` muss zwischen 0% und 200% liegen
diag-bias-bands-order = `fixed-bias-low` liegt über `fixed-bias-high`
diag-these-settings = diese Einstellungen
diag-one-comes-from = einer der beiden Werte stammt aus { $source }
diag-from-shop-profile = dem Werkstattprofil
diag-from-defaults = den Voreinstellungen
diag-decibel-range = `{ $name }` muss zwischen 0 dB und 150 dB liegen
diag-decibels = `{ $name }` muss ein Pegel in Dezibel sein
diag-expected-decibels = Dezibel erwartet
diag-decibels-help = als "60dB" oder 60 schreiben
diag-mains-range-help = Netzspannungen reichen von wenigen Volt an einem Stelltransformator bis zur Obergrenze der Niederspannung von 1000 V (IEC 60038)

## Diagnosen zu Namen, die ins Leere zeigen (src/job/validate.rs). `what`
## ist eine der Wendungen `diag-ref-…` (Nominativ); `kind` ist set,
## channel, position, node, part, heater oder safety.

diag-check-spelling = die Schreibweise mit den im Auftrag erklärten Namen vergleichen
diag-list-valves-first = die Röhren zuerst in einem `valves`-Block aufführen
diag-names-unknown-position = { $what } nennt die Röhrenposition { $name }, die der `valves`-Block nicht aufführt
diag-no-such-position = keine solche Röhrenposition
diag-declare-in-circuit = im Block `circuit` erklären: node B+1 chart="350V"
diag-names-unknown-node = { $what } nennt den Knoten { $name }, der weder in `circuit` erklärt noch gemessen ist
diag-no-such-node = kein solcher Knoten
diag-ref-cathode-resistor = der Kathodenwiderstand { $name }
diag-ref-sense-resistor = ein Messwiderstand
diag-ref-screen-resistor = ein Schirmgitterwiderstand
diag-ref-half-primary = ein Widerstand einer Primärwicklungshälfte
diag-ref-rectifier = der Gleichrichter
diag-ref-readings = die Messwerte von „{ $set }“
diag-ref-warm-up = die Aufwärmreihe von „{ $set }“
diag-ref-mod-figure = ein Rechenwert einer Modifikation
diag-ref-network-source = die Quelle eines Netzwerks
diag-ref-dropper = der Siebwiderstand { $name }
diag-ref-filter-capacitor = der Siebkondensator { $name }
diag-accept-none = der Auftrag hat { $kind ->
        [set] keine Messreihe
        [channel] keinen Prüfstandskanal
        [position] keine Röhrenposition
        [node] keinen Knoten
        [heater] keine Heizungsbezeichnung
        [safety] keine Sicherheitsprüfung
       *[part] kein Bauteil
    } zum Akzeptieren
diag-accept-unknown = die Akzeptierung nennt { $kind ->
        [set] die Messreihe
        [channel] den Prüfstandskanal
        [position] die Röhrenposition
        [node] den Knoten
        [heater] die Heizungsbezeichnung
        [safety] die Sicherheitsprüfung
       *[part] das Bauteil
    } { $name }, doch im Auftrag kommt { $name } nicht vor
diag-accept-no-such = { $kind ->
        [set] keine solche Messreihe
        [channel] kein solcher Prüfstandskanal
        [position] keine solche Röhrenposition
        [node] kein solcher Knoten
        [heater] keine solche Heizungsbezeichnung
        [safety] keine solche Sicherheitsprüfung
       *[part] kein solches Bauteil
    }

## Diagnosen einer Übersetzungsdatei (src/catalogue/check.rs), in der
## Sprache, die das Werkstattprofil nennt, wenn sie eingebaut ist, sonst
## Englisch. `english` ist die englische Meldung, unverändert zitiert.

diag-ftl-syntax = das ist keine Fluent-Syntax: { $problem }
diag-ftl-syntax-help = eine Meldung wird `key = Text` geschrieben; eine Fortsetzungszeile beginnt mit Leerzeichen; ein Argument wird `{"{"} $name {"}"}` geschrieben
diag-ftl-unknown-key = der englische Katalog hat keine Meldung `{ $key }`
diag-ftl-unknown-key-label = keine Meldung des Programms
diag-ftl-no-text = die Meldung `{ $key }` hat keinen Text
diag-ftl-no-text-label = `key = Text` erwartet
diag-ftl-unknown-argument = die Meldung `{ $key }` verwendet `{ $argument }`, das das Programm ihr nie übergibt
diag-ftl-unknown-argument-label = unbekanntes Argument
diag-ftl-no-arguments = diese Meldung hat keine Argumente
diag-ftl-given = sie erhält { $arguments }
diag-ftl-unknown-reference = die Meldung `{ $key }` verweist auf `{ $reference }`, das diese Datei nicht festlegt
diag-ftl-unknown-message = unbekannte Meldung
diag-ftl-notice-incomplete = der Sicherheitshinweis zur Netzspannung wird nur als Ganzes übersetzt; es fehlen: { $keys }
diag-ftl-in-this-file = in dieser Datei
diag-ftl-notice-help = jeden Teil des Hinweises übersetzen (die Schlüssel, die mit `notice-` beginnen), oder eine im Programm eingebaute Sprache verwenden
diag-ftl-add-key-english = `{ $key } = …` ergänzen; das Englische steht in messages/en.ftl:{ $line }: { $english }
diag-ftl-add-key = `{ $key } = …` ergänzen
diag-ftl-missing-key = der Übersetzung fehlt die Meldung `{ $key }`
diag-ftl-unreadable = die Übersetzung konnte nicht gelesen werden

## Diagnosen zum Logo der Werkstatt (src/shop/logo.rs). `why` ist einer der
## Gründe `diag-logo-…` unten, die als Satzende an `diag-logo-refused`
## anschließen.

diag-expected-in-profile-folder = Dateiname im Ordner des Profils erwartet
diag-logo-outside = das Logo `{ $path }` liegt nicht im Ordner des Profils
diag-logo-keep-inside = das Logo neben shop.kdl (oder in einen Ordner darunter) legen und relativ dazu benennen, zum Beispiel logo "logo.svg"
diag-logo-link = das Logo `{ $path }` führt aus dem Ordner des Profils hinaus (nach { $target })
diag-logo-copy = das Logo in den Ordner des Profils kopieren, statt darauf zu verweisen
diag-logo-not-file = das Logo { $path } ist keine gewöhnliche Datei
diag-logo-png-svg = das Logo muss eine PNG- oder SVG-Datei sein
diag-logo-too-large = das Logo { $path } ist { $size } Byte groß; die Grenze liegt bei { $limit }
diag-logo-smaller = ein Logo für den Seitenkopf braucht weit weniger: kleiner exportieren
diag-logo-cannot-read = das Logo { $path } kann nicht gelesen werden: { $error }
diag-logo-in-folder = das Logo muss eine PNG- oder SVG-Datei im Ordner des Profils sein
diag-logo-refused = das Logo { $path } { $why }
diag-logo-self-contained = das Logo muss ein PNG-Bild oder eine in sich geschlossene SVG-Zeichnung sein
diag-logo-not-png-or-text = ist weder ein PNG-Bild noch SVG-Text
diag-logo-not-png-or-svg = ist weder ein PNG-Bild noch eine SVG-Zeichnung
diag-logo-png-undecodable = beginnt wie ein PNG-Bild, lässt sich aber nicht dekodieren ({ $error })
diag-logo-svg-malformed = ist keine wohlgeformte SVG-Zeichnung ({ $error })
diag-logo-svg-root = ist XML mit dem Wurzelelement <{ $root }>, nicht dem <svg> einer SVG-Zeichnung
diag-logo-svg-refers = verweist auf eine andere Datei oder Adresse (`{ $value }` an <{ $element }>); ein Logo muss in sich geschlossen sein
diag-logo-svg-style = hat ein Stylesheet, das von anderswo lädt; ein Logo muss in sich geschlossen sein

## Diagnosen beim Lesen einer Übersetzungsdatei (src/shop/translation.rs),
## an der `language`-Zeile des Profils.

diag-translation-ftl = die Übersetzung muss eine Fluent-Datei (.ftl) im Ordner des Profils sein
diag-translation-utf8-ftl = die Übersetzung muss eine Fluent-Datei (.ftl) in UTF-8 im Ordner des Profils sein
diag-translation-outside = die Übersetzungsdatei `{ $path }` liegt nicht im Ordner des Profils
diag-translation-keep-inside = die Übersetzung neben shop.kdl (oder in einen Ordner darunter) legen und relativ dazu benennen, zum Beispiel file="de.ftl"
diag-translation-link = die Übersetzungsdatei `{ $path }` führt aus dem Ordner des Profils hinaus (nach { $target })
diag-translation-copy = die Übersetzung in den Ordner des Profils kopieren, statt darauf zu verweisen
diag-translation-not-file = die Übersetzungsdatei { $path } ist keine gewöhnliche Datei
diag-translation-too-large = die Übersetzungsdatei { $path } ist größer als { $limit } MiB; eine Übersetzung ist weit kleiner, wahrscheinlich ist es die falsche Datei
diag-translation-cannot-read = die Übersetzungsdatei { $path } kann nicht gelesen werden: { $error }
diag-translation-not-utf8 = { $place }: die Übersetzungsdatei ist kein UTF-8-Text (hier das Byte { $byte }); als UTF-8 speichern

## Diagnosen zu Werten des Werkstattprofils, einem Muster für
## Auftragsnummern, einem unbekannten Röhrentyp und einem Foto, das sich
## nicht dekodieren lässt (src/shop/decode.rs, src/job/numbering.rs,
## src/job/valve_types.rs, src/photo/mod.rs). `diag-pattern-…` ergänzen
## `diag-bad-pattern`; die `diag-photo-…` unten ergänzen
## `diag-photo-undecodable` als Satzende.

diag-what-logo-name = der Dateiname des Logos
diag-what-job-number-pattern = das Muster für Auftragsnummern
diag-what-language = die Sprache
diag-what-shop-format = die Formatversion des Werkstattprofils
diag-what-shop-name = der Name der Werkstatt
diag-what-paper-size = das Papierformat
diag-what-warranty-text = der Text der Gewährleistung
diag-pattern-not-closed = eine `{"{"}` wird nicht mit `{"}"}` geschlossen
diag-pattern-not-opened = vor einer `{"}"}` steht keine `{"{"}`
diag-pattern-unknown-piece = `{ $piece }` ist kein Baustein einer Auftragsnummer; {"{"}yyyy{"}"}, {"{"}yy{"}"}, {"{"}mm{"}"}, {"{"}dd{"}"}, {"{"}yymm{"}"} und eine Zählung {"{"}nnn{"}"} verwenden
diag-pattern-slash = eine Auftragsnummer darf keinen Schrägstrich und kein Steuerzeichen enthalten (sie benennt die Datei des Auftrags)
diag-pattern-one-count = eine Auftragsnummer braucht genau eine Zählung, etwa {"{"}nnn{"}"}; dieses Muster hat { $count }
diag-valve-type-help = `ampreport tubes` zeigt die bekannten Typen; ein fehlender lässt sich mit einer Grenzwertdatei der Werkstatt ergänzen (--ratings DATEI)
diag-valve-type-did-you-mean = meinten Sie { $names }? (`ampreport tubes` zeigt jeden Typ; eine Grenzwertdatei der Werkstatt kann einen ergänzen)
diag-photo-too-large-to-decode = ist ein zu großes Bild zum Dekodieren (höchstens { $side } Pixel je Seite und { $megabytes } MB an Bildpunkten)
diag-photo-does-not-decode = lässt sich nicht als Bild dekodieren ({ $error })
diag-photo-not-encoded = konnte nicht neu kodiert werden ({ $error })

## Was der Bildleser an einem Foto oder einem PNG-Logo beanstandet
## (src/photo/mod.rs). `$detail` sind die eigenen Worte des Lesers.

diag-image-damaged = seine Daten sind beschädigt oder abgeschnitten ({ $detail })
diag-image-not-encoded = es ließ sich nicht wieder schreiben ({ $detail })
diag-image-too-large = es ist größer, als die Grenzen des Lesers erlauben
diag-image-unsupported = es ist eine Bildart, die der Leser nicht unterstützt ({ $detail })

## Was der XML-Leser an einem SVG-Logo beanstandet (src/shop/logo.rs).

diag-xml-at = { $what } (Zeile { $line }, Spalte { $column })
diag-xml-ends-early = sie endet, bevor die Zeichnung vollständig ist
diag-xml-no-root = sie enthält kein Element
diag-xml-dtd = sie hat eine Dokumenttyp-Deklaration, die nicht erlaubt ist
diag-xml-wrong-close = `</{ $found }>` schließt ein Element, das `<{ $expected }>` ist
diag-xml-unknown-entity = die Entität `&{ $name };` ist nicht definiert
diag-xml-duplicate-attribute = das Attribut `{ $name }` ist doppelt angegeben
diag-xml-unknown-namespace = das Namensraum-Präfix `{ $name }` ist nicht deklariert
diag-xml-bad-name = ein Name, den XML nicht erlaubt
diag-xml-bad-attribute = ein Attributwert, den XML nicht erlaubt
diag-xml-too-many = sie hat mehr Elemente, Attribute oder Namensräume, als ein Logo haben darf

## Beispiele in Diagnosen, deren Beispieltexte der Leser selbst schreibt:
## KDL, wie es geschrieben würde, die Texte in der Sprache der Werkstatt
## (src/job/decode.rs, src/shop/decode.rs). Knoten- und Eigenschaftsnamen
## bleiben, wie sie sind.

diag-rectifier-example = rectifier V5   oder   rectifier silicon
diag-shop-example = shop "Name Ihrer Werkstatt" {"{"} address "…"; contact "…" {"}"}
diag-warranty-example = warranty "Für ausgeführte Arbeiten und eingebaute Teile gewähren wir…" period="90 days"
diag-accept-example-valve = valve V3 check=screen-voltage reason="Auslegung des Herstellers"
diag-accept-example-node = node B+1 reason="…"
diag-accept-example-part = part C10 reason="…"
diag-accept-example-heater = heater reason="…"
diag-accept-example-safety = safety leakage reason="…"
diag-accept-example-bench = bench output-power channel="links" reason="…"

## Die übrigen Meldungen im Terminal (src/cli), in der Sprache des
## Werkstattprofils, sobald es gelesen ist; die Schlusszeile eines Stapels
## in der Sprache, die alle seine Aufträge teilen, sonst Englisch.

cli-rendered = erstellt { $job } → { $output } in { $time }
cli-unchanged = unverändert { $output }
cli-failed = fehlgeschlagen { $job }: { $error }
cli-see-above = siehe oben
cli-no-message = keine Meldung
cli-summary = { $jobs ->
        [one] 1 Auftrag
       *[other] { $jobs } Aufträge
    } in { $time }: { $rendered } erstellt, { $unchanged } unverändert, { $failed } fehlgeschlagen
cli-summary-stopped = , { $count } nicht begonnen (angehalten)
cli-progress-jobs = Aufträge
cli-watch-failed = fehlgeschlagen { $job } nach { $time }; { $output } blieb unverändert
cli-wrote = geschrieben: { $path }
cli-wrote-stdout = das PDF auf die Standardausgabe geschrieben
cli-up-to-date = { $path } ist aktuell (--force erstellt es trotzdem)
cli-shop-templates-failed = Hinweis: das Dokument aus den Vorlagen der Werkstatt in { $folder } ist fehlgeschlagen; der Fehler liegt in den Vorlagen, nicht im Auftrag
cli-built-in-template-failed = Hinweis: die eingebaute Vorlage ist fehlgeschlagen; das ist ein Fehler in ampreport, bitte melden
cli-left-as-it-was = Hinweis: { $path } blieb unverändert
cli-undrawable = Warnung: { $place }: der Text von { $field } enthält Zeichen, die die Schriften des Dokuments nicht darstellen können ({ $chars }); sie erscheinen als { $placeholder }
cli-field-of = `{ $key }` von `{ $node }`
cli-cannot-make-folder = Fehler: der Ordner { $folder } für das PDF konnte nicht angelegt werden: { $error }
cli-listing-name-clash = Fehler: das PDF der Auflistung { $path } würde von ihrem eigenen Markdown überschrieben; das PDF mit .pdf benennen
cli-cannot-write-source = Fehler: der erzeugte Quelltext konnte nicht nach { $folder } geschrieben werden: { $error }
cli-wrote-source = den erzeugten Quelltext nach { $folder } geschrieben
cli-same-pdf-from = dasselbe PDF entsteht mit: { $command }
cli-typst-warned =
    typst warnte:
    { $warnings }
cli-cannot-record = Warnung: es konnte nicht festgehalten werden, woraus { $path } entstand ({ $error }); der nächste Lauf erstellt es neu

## `ampreport compare` (src/report/compare.rs, src/cli/compare.rs): die
## Tabelle der geänderten Werte, in der Sprache des Werkstattprofils.

cli-compare-no-such-set = Fehler: { $job } hat keine Messreihe „{ $label }“; vorhanden sind { $known }
cli-compare-no-such-set-none = Fehler: { $job } hat keine Messreihe „{ $label }“; es gibt keine
cli-compare-path-from-here = Hinweis: in REV:PFAD liest git den PFAD ab dem obersten Ordner des Repositorys; für die Datei, von diesem Ordner aus benannt, { $spelling } schreiben
cli-compare-set-name = „{ $label }“
cli-compare-set-only-in = Messreihe „{ $label }“ nur in { $side }
cli-compare-nothing-changed = kein Wert hat sich geändert
cli-compare-changed = { $count ->
        [one] 1 Wert geändert
       *[other] { $count } Werte geändert
    }
cli-compare-col-set = Messreihe
cli-compare-col-what = was
cli-compare-col-figure = Größe
cli-compare-col-old = alt
cli-compare-col-new = neu
cli-compare-col-change = Änderung
cli-compare-safety = Sicherheit
cli-compare-mains = Netz
cli-compare-figure-plate-volts = Anodenspannung
cli-compare-figure-screen-volts = Schirmgitterspannung
cli-compare-figure-cathode-volts = Kathodenspannung
cli-compare-figure-grid-volts = Gitterspannung
cli-compare-figure-cathode-current-ma = Kathodenstrom
cli-compare-figure-plate-current-ma = Anodenstrom
cli-compare-figure-screen-current-ma = Schirmgitterstrom
cli-compare-figure-plate-dissipation-w = Anodenverlustleistung
cli-compare-figure-plate-dissipation-pct = Anodenverlustleistung %
cli-compare-figure-high-line-plate-dissipation-pct = Anodenverlustleistung, obere Grenze %
cli-compare-figure-screen-dissipation-w = Schirmgitterverlustleistung
cli-compare-figure-screen-dissipation-pct = Schirmgitterverlustleistung %
cli-compare-figure-status = Status
cli-compare-figure-measured-volts = gemessen
cli-compare-figure-corrected-volts = korrigiert
cli-compare-figure-deviation-pct = Abweichung %
cli-compare-figure-high-line-volts = obere Grenze
cli-compare-figure-voltage-volts = Spannung
cli-compare-figure-current-ma = Strom
cli-compare-figure-power-w = Leistung
cli-compare-figure-power-pct = Leistung %
cli-compare-figure-high-line-power-pct = Leistung, obere Grenze %
cli-compare-figure-highest-volts = Höchstwert
cli-compare-figure-margin-pct = Reserve %
cli-compare-figure-mains-volts = Netzspannung
cli-compare-figure-measured-value = gemessen

## `ampreport init` und `ampreport new` (src/cli/init.rs, src/cli/new.rs).
## `init` liest kein Werkstattprofil und spricht Englisch; `new` spricht
## die Sprache des Profils, nach dem es den Auftrag nummeriert.

cli-init-wrote = geschrieben: { $path }; { $next }
cli-init-exists = Fehler: { $path } gibt es schon; ampreport überschreibt nie eine Datei
cli-init-cannot-write = Fehler: { $path } kann nicht geschrieben werden: { $error }
cli-init-cannot-make-folder = Fehler: der Ordner { $folder } kann nicht angelegt werden: { $error }
cli-init-next-job = ausfüllen, dann `ampreport check { $path }` ausführen
cli-init-next-shop = ausfüllen; Aufträge in seinem Ordner und darunter verwenden es (siehe docs/shop.md)
cli-init-next-gitattributes = PDFs und Fotos sind für git Binärdateien, Auftragsdateien sind Text
cli-init-next-gitignore = erstellte Dokumente bleiben aus git heraus; siehe docs/git.md
cli-new-next = die Messwerte eintragen, dann `ampreport check { $path }` ausführen
cli-new-fault = Hinweis: die neue Auftragsdatei konnte nicht erstellt werden; das ist ein Fehler in ampreport, bitte melden
cli-new-not-a-folder = Fehler: { $folder } ist kein Ordner
cli-new-started-from =
    Begonnen mit { $file } (Auftrag { $id }) über `ampreport new --from`: das Gerät, das Netz,
    die Röhrenbestückung und die Schaltung sind übernommen; Messwerte, Teile, Änderungen,
    Sicherheitsprüfungen, Notizen, Kunde und Kosten nicht.
cli-new-readings = Messwerte dieses Auftrags:

## Die Kommentare des Auftragsgerüsts, das `init` und `new` schreiben
## (templates/job-skeleton.kdl): jede Zeile einer Meldung wird eine
## Kommentarzeile.

cli-skeleton-intro = Eine Auftragsdatei für ampreport (KDL 2.0). Eine Datei je Reparatur;
    unter Versionsverwaltung halten und die Dokumente daraus neu erzeugen.
cli-skeleton-values = Werte: eine bloße Zahl ist in der SI-Grundeinheit (Volt, Ampere, Ohm,
    Watt, Farad, Hertz). Textwerte dürfen einen SI-Vorsatz oder einen
    RKM-Code und ein Einheitenzeichen tragen: "470k", "4k7", "4R7", "0.022u",
    "38.5mV", "34mA", "22µF". Das Zeichen muss zum Feld passen: "38.5mA", wo
    eine Spannung hingehört, ist ein Fehler. Prozente: "10%" oder 10.
    Datumsangaben: "JJJJ-MM-TT". Text in doppelten Anführungszeichen;
    Wahrheitswerte sind #true und #false. Zahlen immer mit Dezimalpunkt.
cli-skeleton-format = Das Format, in dem diese Datei geschrieben ist. Immer zuerst.
cli-skeleton-job = Der Auftrag: Kennung (Pflicht), Eingangs- und Fertigstellungsdatum,
    Techniker.
cli-skeleton-customer = Der Kunde (freiwillig; erscheint nie in einer Verkaufsübersicht).
cli-skeleton-unit = Das Gerät: Hersteller und Modell (Pflicht), Seriennummer, Baujahr;
    Beschreibung und Zustand als Unterknoten. rated-power ist die Nennleistung
    laut Hersteller, für die Messungen am Prüfplatz.
cli-skeleton-mains = Netz: örtliche Nennspannung (Pflicht) und Frequenz; die Toleranz des
    Netzes für die Hochrechnung auf die obere Netzgrenze (Vorgabe +5 % bei
    100–130 V Nennspannung, nach ANSI C84.1 Bereich A, sonst +10 %, nach
    IEC 60038); und die Netzspannung, von der die Spannungstabelle des
    Herstellers ausgeht.
cli-skeleton-valves = Die Röhrenbestückung: Position, Typ (wie ihn die Datentabelle kennt, siehe
    `ampreport tubes`) und Aufgabe: preamp (Vorstufe), phase-inverter
    (Phasenumkehr), output (Endstufe), rectifier (Gleichrichter), tremolo,
    reverb-driver (Hall-Treiber), reverb-recovery (Hall-Rückgewinnung) oder
    other.
cli-skeleton-circuit = Angaben zur Schaltung, die die Berechnungen brauchen.
cli-skeleton-bias = cathode (automatische) oder fixed (feste Gittervorspannung)
cli-skeleton-cathode-resistor = Ein Kathodenwiderstand, auch gemeinsam für ein Paar:
cli-skeleton-sense-resistor = Ein Messwiderstand von einer Kathode nach Masse, zum Prüfen des
    Ruhestroms:
cli-skeleton-screen-resistor = Ein Schirmgitterwiderstand und der Knoten, der ihn speist (ergibt den
    Schirmgitterstrom):
cli-skeleton-half-primary = Gleichstromwiderstand einer Halbwicklung (kalt und ausgeschaltet
    gemessen), für das Verfahren über den Trafowiderstand; bei einem
    Parallelpaar beide Röhren nennen:
cli-skeleton-nodes = Versorgungsknoten mit dem Wert aus der Spannungstabelle und seiner
    Toleranz:
cli-skeleton-droppers = Siebwiderstände zwischen zwei Knoten, mit ihrer Belastbarkeit:
cli-skeleton-filter-capacitors = Siebkondensatoren an einem Knoten, mit ihrer Spannungsfestigkeit:
cli-skeleton-winding = Die Hochspannungswicklung: Effektivspannung je Seite und die
    Primärspannung, für die dieser Wert gilt (ergibt die Spitze beim
    Kaltstart):
cli-skeleton-rectifier = Der Gleichrichter: eine Röhrenposition oder `silicon` (drop="1V"
    freiwillig).
cli-skeleton-measurements = Eine oder mehrere Messreihen, jede mit der dabei gemessenen Netzspannung.
cli-skeleton-node-reading = Ein Knoten: Name und gemessene Spannung (chart= und tolerance= können
    den Wert der Schaltung für diese Messung ersetzen).
cli-skeleton-valve-reading = Eine Röhre: Anoden-, Schirmgitter-, Kathoden- und Gitterspannung gegen
    Masse; die Spannung am Messwiderstand (sense=) oder an der Halbwicklung
    (primary-drop=); oder ein direkt gemessener Strom mit method=probe
    (Bias-Messadapter: Kathodenstrom) oder method=shunt (Strommesser über
    der halben Primärwicklung: Anodenstrom).
cli-skeleton-final-set = Die letzte Messreihe (oder die mit final=#true) ist der Zustand, in dem das
    Gerät übergeben wird: Zusammenfassung, Übersicht und --strict beurteilen sie.
cli-skeleton-bias-control = Wo der Bias-Regler stehen geblieben ist, in eigenen Worten:
cli-skeleton-type-change = Ein anderer Röhrentyp in dieser Messreihe (ein getauschter
    Gleichrichter):
cli-skeleton-set-circuit = Bauteile, die in dieser Messreihe vom Schaltungsblock abweichen:
cli-skeleton-output-power = Messungen am Prüfplatz an einer Lastnachbildung. Ausgangsleistung: der
    Messwert als rms= oder peak-to-peak=, dazu at=clipping, ein Klirrfaktor
    (at="5%") oder die Eingangsspannung (at="0.5V"); Frequenz ohne Angabe 1
    kHz.
cli-skeleton-hum-noise = Brumm und Rauschen: Effektivspannung an der Last, Eingang kurzgeschlossen
    oder offen.
cli-skeleton-gain = Verstärkung: Eingangsspannung für einen Ausgangswert.
cli-skeleton-response = Frequenzgang: Ausgangsspannung je Frequenz bei fester Eingangsspannung;
    ein Messwert muss bei der Bezugsfrequenz liegen (Vorgabe 1 kHz).
cli-skeleton-suggest = Bei automatischer Gittervorspannung einen Vorschlag für den
    Kathodenwiderstand anfordern (er erscheint von selbst, wenn eine Röhre
    über dem Richtwert läuft):
cli-skeleton-warm-up = Messwerte während des Warmlaufens, nach Zeit seit dem Einschalten:
cli-skeleton-part-without-reference = Ein Bauteil ohne Bezeichnung in der Schaltung:
cli-skeleton-mods = Ein Umbau kann ein Netzwerk mitbringen: die Schaltung, die er ändert, wie sie
    war, dann die Änderungen, die sie zum Zustand bei Übergabe machen. Das
    Dokument zeichnet den Frequenzgang vorher und nachher für jede Stellung
    des Potentiometers (0-10; mehrere Stellungen, "3 7", ergeben je eine
    Kurve). `ground` ist der Bezugsknoten. Siehe docs/job-format.md.
cli-skeleton-safety = Sicherheitsprüfungen mit dem angewandten Grenzwert. Die Grenzwerte nach den
    Regeln setzen, die dort gelten, wo Sie arbeiten; dies sind übliche Vorgaben.
cli-skeleton-private = Eine Notiz (oder ein Bauteil, ein Umbau, der Befund, die Arbeit) mit
    private=#true erscheint nicht in der Verkaufsübersicht (render
    --listing):
cli-skeleton-photos = Fotos, relativ zum Ordner dieser Datei (PNG oder JPEG, höchstens 20 MB);
    das Übergabedokument zeigt alle, die Verkaufsübersicht die mit listing=#true:
cli-skeleton-accepted = Befunde, die Sie beurteilt haben und so akzeptieren, jeder mit seiner
    Begründung (by= und date= sind ohne Angabe der Techniker und das
    Fertigstellungsdatum des Auftrags):
cli-skeleton-settings = Richtbereiche und Reserven; gezeigt sind die Vorgaben (übliche Praxis).

## Die Art der Gittervorspannung in der Röhrentabelle des Terminals
## (src/report/terminal.rs).

term-bias-cathode = automatisch
term-bias-fixed = fest

## Was zwischen dem fertigen Quelltext des Dokuments und dem PDF schiefging:
## Fehler von typst und des Satzordners (src/typeset). Ein Fehler, der vor
## dem Lesen des Werkstattprofils auffällt (typst fehlt oder ist zu alt),
## wird auf Englisch gemeldet. `$why` von `cli-typst-incomplete` ist einer
## der Gründe `cli-typst-pdf-…`; deren `$detail` sind die Worte des
## PDF-Lesers (lopdf), unübersetzt.

cli-typst-not-found = typst wurde nicht gefunden: { $looked }
cli-typst-not-found-help = mit `{ $install }` installieren oder das Programm mit `--typst PFAD` oder der Umgebungsvariablen AMPREPORT_TYPST angeben
cli-typst-looked-path = kein `{ $program }` im PATH
cli-typst-looked-path-given = kein `{ $path }` im PATH ({ $origin })
cli-typst-looked-missing = { $path } gibt es nicht ({ $origin })
cli-typst-looked-not-executable = { $path } ist keine ausführbare Datei ({ $origin })
cli-typst-origin-option = der mit --typst angegebene Pfad
cli-typst-origin-env = der Pfad in AMPREPORT_TYPST
cli-typst-too-old = { $path } ist typst { $found }, ampreport braucht aber typst { $needed } oder neuer
cli-typst-too-old-help = mit `{ $install }` aktualisieren oder `--typst PFAD` auf ein neueres zeigen lassen
cli-typst-unusable = { $path } ließ sich nicht als typst ausführen: { $problem }
cli-typst-unusable-help = prüfen, ob dies das Kommandozeilenprogramm typst ist und ob es läuft; ein frisches gibt es mit `{ $install }`
cli-typst-failed-to-start = es ließ sich nicht starten ({ $error })
cli-typst-version-unreadable = seine Antwort auf `--version` war nicht lesbar ({ $error })
cli-typst-version-odd = `--version` { $status } und gab { $said } aus, nicht `typst X.Y.Z`
cli-typst-compile-failed =
    typst konnte das Dokument nicht setzen (es { $status }):
    { $diagnostics }
cli-typst-compile-failed-help = der erzeugte Quelltext wurde zur Prüfung in { $kept } aufbewahrt; Dateinamen in den Meldungen oben beziehen sich auf diesen Ordner
cli-typst-misbehaved = das Programm typst { $path } { $what }{ $said }
cli-typst-misbehaved-help = das deutet auf das Programm typst oder den Rechner hin, auf dem es läuft (Speicher, Festplatte), nicht auf den Auftrag: dasselbe typst mit dem aufbewahrten Quelltext in { $kept } versuchen oder mit `{ $install }` frisch installieren
cli-typst-it-said =
    ; es meldete:
    { $diagnostics }
cli-typst-no-messages = { $status } und gab keine Meldungen aus
cli-typst-crashed = { $status }; so meldet ein Rust-Programm einen Absturz
cli-typst-odd-status = { $status }; diesen Status verwendet typst nicht für einen Fehler im Dokument
cli-typst-no-file = meldete Erfolg, schrieb aber keine Datei
cli-typst-too-big = meldete Erfolg, schrieb aber { $size } Bytes, mehr als die { $limit }, die ein Dokument haben darf
cli-typst-incomplete = meldete Erfolg, schrieb aber eine unvollständige Datei: { $why }
cli-typst-pdf-empty = sie ist leer
cli-typst-pdf-not-pdf = sie beginnt nicht wie ein PDF (`%PDF-`)
cli-typst-pdf-no-end = sie endet nach { $size } Bytes ohne die Dateiende-Marke `%%EOF`
cli-typst-pdf-unparsable = sie lässt sich nicht als PDF lesen ({ $detail })
cli-typst-pdf-no-pages = sie hat keine Seiten
cli-typst-pdf-misplaced = ihr Objekt { $object } steht nicht bei Byte { $offset }, wo ihre Querverweistabelle es verortet
cli-typst-pdf-reader-stopped = der PDF-Leser brach beim Lesen ab
cli-typst-timed-out = das Programm typst { $path } hat `{ $action }` nicht innerhalb von { $seconds } s beendet und wurde angehalten{ $said }
cli-typst-timed-out-help = ein Übergabedokument dauert einige Sekunden; ein typst, das hängt, ist fehlerhaft, oder der Rechner ist sehr ausgelastet. Mehr Zeit mit `--timeout SEKUNDEN` oder AMPREPORT_TIMEOUT erlauben
cli-typst-interrupted = angehalten durch { $signal }; typst wurde angehalten und die temporären Dateien entfernt
cli-typst-signal-named = { $name } (Signal { $number })
cli-typst-signal = Signal { $number }
cli-typst-missing-text = das fertige Dokument zeigt { $what } nicht: { $missing } { $count ->
        [one] fehlt
       *[other] fehlen
    } in seinem Text
cli-typst-missing-text-help = die Vorlage muss { $what } lesbar platzieren; der erzeugte Quelltext wurde in { $kept } aufbewahrt
cli-typst-notice = den Sicherheitshinweis zur Netzspannung und den Verweis auf die örtlichen Elektrovorschriften
cli-typst-bad-sandbox-path = `{ $path }` kann nicht in den Satzordner gelegt werden: { $reason }
cli-typst-bad-sandbox-path-help = einen einfachen relativen Pfad wie `plots/anode.svg` verwenden
cli-typst-path-not-in-sandbox = es ist keine der Dateien des Satzordners
cli-typst-path-empty = der Pfad ist leer
cli-typst-path-not-relative = der Pfad muss relativ sein
cli-typst-path-backslash = `/` zwischen Ordnernamen verwenden
cli-typst-path-control = der Pfad enthält ein Steuerzeichen
cli-typst-path-dots = der Pfad hat einen leeren Teil, `.` oder `..`
cli-typst-path-fonts = der Ordner `fonts/` ist den mitgelieferten Schriften vorbehalten
cli-typst-io-create-folder = in { $path } konnte kein Ordner angelegt werden
cli-typst-io-write-files = die Dateien für den Satz konnten nicht nach { $path } geschrieben werden
cli-typst-io-write-fonts = die Schriften konnten nicht nach { $path } geschrieben werden
cli-typst-io-wait = auf typst beim Setzen von { $path } konnte nicht gewartet werden
cli-typst-io-read-pdf = das von typst geschriebene PDF { $path } konnte nicht gelesen werden
cli-typst-io-write-stdout = das PDF konnte nicht auf die Standardausgabe geschrieben werden
cli-typst-io-create-temporary = in { $path } konnte keine temporäre Datei angelegt werden
cli-typst-io-write = { $path } konnte nicht geschrieben werden
cli-program-exited = endete mit Status { $code }
cli-program-killed-named = wurde durch Signal { $signal } ({ $name }) beendet
cli-program-killed = wurde durch Signal { $signal } beendet
cli-program-ended = endete mit { $status }
cli-program-more-output = … { $bytes } weitere Bytes der Ausgabe nicht gezeigt

## Das Netzwerk einer Änderung in Worten (src/calc/network/mod.rs): seine
## Quelle, seine Eingriffe und warum es sich nicht berechnen ließ.

figure-network-ideal-source = eine ideale Spannungsquelle (ohne Ausgangswiderstand)
figure-network-source-impedance = eine Quelle mit { $impedance } Ausgangswiderstand
figure-network-valve-source = { $position } ({ $type }, μ { $mu }, ra { $ra }) mit { $load } Anodenwiderstand{ $how } = { $impedance } Ausgangswiderstand
figure-network-bypassed = : ra ∥ RL
figure-network-unbypassed = , Kathodenwiderstand { $resistor } ohne Überbrückung: (ra + (μ + 1)·Rk) ∥ RL
figure-network-not-in-line-up = die Röhrenposition { $position } ist nicht in der Bestückung
figure-network-not-in-ratings = { $type } steht nicht in der Datentabelle
figure-network-no-mu-ra = { $position } ({ $type }) hat in der Datentabelle keine typischen Werte für μ und ra
figure-network-singular = die Gleichungen des Netzwerks sind bei { $frequency } Hz singulär: ein Knoten hat bei dieser Frequenz keinen Weg nach Masse
figure-network-set-to = eingestellt auf { $settings }
figure-network-taper-linear = lineare Kennlinie
figure-network-taper-audio = logarithmische Kennlinie
figure-network-removed-value = { $reference } ({ $value }) entfernt
figure-network-removed = { $reference } entfernt
figure-network-added-link = { $reference } hinzugefügt: eine Brücke von { $from } nach { $to }
figure-network-added = { $reference } hinzugefügt: { $kind } { $value } zwischen { $nodes }
figure-network-source-changed = die Quelle wurde geändert
figure-network-load-now = die Last ist jetzt { $load } an { $node }
figure-network-unloaded = an { $node } liegt jetzt keine Last mehr
figure-network-kind-resistor = Widerstand
figure-network-kind-capacitor = Kondensator
figure-network-kind-inductor = Spule
figure-network-kind-link = Brücke
figure-network-kind-pot = Potentiometer

## Was `check`, `render` und `watch` sagen, bevor ein Werkstattprofil
## gelesen ist oder über keinen einzelnen Auftrag: das Programm sagt es
## immer auf Englisch (docs/shop.md); die Übersetzung steht hier, damit der
## Katalog vollständig ist.

cli-error = Fehler: { $error }
cli-warning = Warnung: { $warning }
cli-no-job-files = Fehler: keine Auftragsdateien (*.kdl) in { $folders }
cli-no-job-files-here = Fehler: keine Auftragsdateien (*.kdl) in { $folders } (--recursive durchsucht auch die Unterordner)
cli-no-stop-signals = Warnung: Stoppsignale beenden ampreport ohne Aufräumen: { $error }
cli-output-one-job = Fehler: -o benennt das PDF einer einzigen Auftragsdatei; für mehrere Aufträge oder einen Ordner --out-dir ORDNER verwenden
cli-emit-source-one-job = Fehler: --emit-source schreibt den Quelltext eines einzigen Auftrags; eine Auftragsdatei angeben
cli-stdin-one-job = Fehler: `-` liest einen Auftrag von der Standardeingabe; es kann nicht neben anderen Aufträgen angegeben werden
cli-outputs-clash = Fehler: { $first } und { $second } würden beide nach { $output } geschrieben; --out-dir ORDNER verwenden oder eine Datei umbenennen
cli-no-run-key = Warnung: { $error }; jeder Auftrag wird neu erstellt
cli-stdout-is-terminal = Fehler: `-o -` schreibt das PDF auf die Standardausgabe, und die ist hier ein Terminal; in eine Datei oder an ein Programm leiten (`-o - > auftrag.pdf`, `-o - | lpr`)
cli-listing-needs-file = Fehler: die Auflistung ist ein PDF mit Markdown daneben und braucht deshalb eine Datei: mit `-o DATEI.pdf` benennen
cli-stdin-needs-output = Fehler: ein von der Standardeingabe gelesener Auftrag hat keine Datei, neben die das PDF kommen könnte; die Ausgabe mit `-o DATEI` benennen oder `-o -` für die Standardausgabe
cli-no-template-folder = Fehler: den Vorlagenordner { $folder } gibt es nicht, oder er ist kein Ordner
cli-typst-newer = { $path } ist typst { $version }, neuer als die geprüfte Reihe { $series }.x; das Dokument kann anders aussehen
cli-no-workers = Fehler: { $workers } Arbeitsthreads konnten nicht gestartet werden: { $error }
cli-watch-no-stop-signals = Warnung: Strg-C beendet die Überwachung ohne Aufräumen: { $error }
cli-watch-no-stdin = Fehler: watch braucht Auftragsdateien zum Überwachen; `-` (Standardeingabe) lässt sich nicht überwachen
cli-watch-no-stdout = Fehler: watch schreibt PDF-Dateien; `-o -` (Standardausgabe) ist nicht möglich
cli-watch-cannot = Fehler: Dateien lassen sich auf diesem System nicht überwachen: { $error }
cli-watching = { $count ->
        [one] 1 Auftrag wird auf Änderungen überwacht (Strg-C beendet)
       *[other] { $count } Aufträge werden auf Änderungen überwacht (Strg-C beendet)
    }
cli-watch-stopped = Überwachung beendet
cli-watch-trouble = Warnung: beim Überwachen der Dateien: { $error }
cli-watcher-stopped = Fehler: die Dateiüberwachung wurde beendet
cli-watch-folder = { $folder } lässt sich nicht überwachen: { $error }
cli-shop-beside-job = Hinweis: es gilt das Werkstattprofil { $used } neben dem Auftrag; --shop { $named } gilt nur, wo keines vorhanden ist
cli-reading-stdin = Hinweis: der Auftrag wird von der Standardeingabe gelesen; mit Strg-D abschließen

## Ein Dokument, das sich vor dem Aufruf von typst nicht zusammenstellen
## ließ (src/cli/render.rs), in der Sprache des Auftrags.

cli-template-not-filled = Fehler: die Vorlage { $name } ließ sich nicht ausfüllen: { $detail }
cli-shop-image-unreadable = Fehler: das Bild der Werkstatt { $path } ließ sich nicht lesen: { $error }
cli-template-file-refused = Fehler: eine Datei des Vorlagenordners wurde abgelehnt: { $error }
cli-chart-failed = das Diagramm { $chart ->
        [plate-dissipation] der Anodenverlustleistung
        [supply-chain] der Versorgungskette
        [warm-up] des Warmlaufens
        [network-response] des Netzwerk-Frequenzgangs
       *[frequency-response] des Frequenzgangs
    } ließ sich nicht zeichnen: { $detail }

## Was die Vorlagen-Engine beanstandet (src/typeset/template_env.rs,
## src/typeset/inside.rs, src/report/handover/mod.rs), das `$detail` von
## `cli-template-not-filled`. `$detail` von `cli-template-engine-said`
## sind die eigenen (englischen) Worte der Engine, nur wenn sie eine Zeile
## der Vorlage nennt.

cli-template-place = { $what } ({ $name }, Zeile { $line })
cli-template-engine-said = { $what }: { $detail }
cli-template-kind-syntax = ein Syntaxfehler
cli-template-kind-undefined = ein Wert, den die Vorlage verwendet, ist nicht definiert
cli-template-kind-unknown-filter = ein Filter, den es nicht gibt
cli-template-kind-unknown-test = ein Test, den es nicht gibt
cli-template-kind-unknown-function = eine Funktion, die es nicht gibt
cli-template-kind-unknown-method = eine Methode, die es nicht gibt
cli-template-kind-not-found = eine Vorlage, die sie einbindet oder importiert, fehlt
cli-template-kind-too-many-arguments = zu viele Argumente
cli-template-kind-missing-argument = ein Argument fehlt
cli-template-kind-bad-escape = eine Zeichenkette mit einer ungültigen Escape-Sequenz
cli-template-kind-invalid-operation = eine Operation, die ihre Werte nicht erlauben
cli-template-kind-wrong-value = ein Wert der falschen Art
cli-template-kind-bad-include = eine eingebundene Vorlage ließ sich nicht ausfüllen
cli-template-kind-other = die Vorlagen-Engine hat abgebrochen
cli-template-autoescape = die Vorlage `{ $name }` verwendet `{"{"}% autoescape %{"}"}`, was Typst-Vorlagen nicht dürfen
cli-template-bad-name = der Vorlagenname `{ $name }` ist kein einfacher relativer Pfad
cli-template-refused = die Vorlage `{ $name }` wurde abgelehnt: { $why }
cli-template-not-utf8 = die Vorlage `{ $name }` ist kein UTF-8-Text
cli-template-no-message = der Meldungskatalog ({ $language }, { $origin }) hat keine Meldung `{ $key }`
cli-template-not-rows = der Filter `typst_rows` nimmt die Zeilen einer Tabelle, wie das Programm sie liefert (`set.nodes`, `set.valves` …), keinen anderen Wert
cli-template-no-notice = { $what ->
        [listing] die Verkaufsübersicht
       *[document] das Dokument
    } muss den Sicherheitshinweis zur Netzspannung enthalten: die Zeile `{ $line }` in die Vorlage setzen
cli-inside-link = { $path } ist ein symbolischer Link; verwendet werden nur reguläre Dateien im Vorlagenordner (die Datei hineinkopieren, statt sie zu verlinken)
cli-inside-not-a-file = { $path } ist keine reguläre Datei
cli-inside-bad-name = `{ $name }` ist kein einfacher relativer Pfad im Vorlagenordner
cli-inside-cannot-read = { $path } konnte nicht gelesen werden: { $error }

## Wohin ein Dokument nicht geschrieben werden darf (src/typeset/output.rs),
## in der Sprache des Auftrags, sobald sein Werkstattprofil gelesen ist.

cli-output-folder = die Ausgabe { $path } benennt einen Ordner, keine Datei
cli-output-folder-help = die Datei benennen, zum Beispiel `-o { $example }`
cli-output-link = die Ausgabe { $path } ist ein symbolischer Link (auf { $target }); ampreport schreibt nicht durch Links
cli-output-link-help = die Datei selbst mit `-o` benennen oder den Link entfernen
cli-output-not-a-file = die Ausgabe { $path } existiert und ist { $kind }, keine gewöhnliche Datei
cli-output-not-a-file-help = ampreport überschreibt nur eine gewöhnliche Datei; mit `-o` einen anderen Pfad angeben
cli-output-no-folder = den Ordner der Ausgabe { $path } gibt es nicht
cli-output-no-folder-help = den Ordner zuerst anlegen oder mit `-o` einen anderen Pfad angeben
cli-output-is-input = die Ausgabe { $path } ist { $what } ({ $input }); dorthin zu schreiben würde sie zerstören
cli-output-is-input-help = mit `-o` einen anderen Pfad angeben
cli-output-inside-input = die Ausgabe { $path } liegt in einem Ordner, der gelesen wird ({ $what }: { $input })
cli-output-inside-input-help = ampreport liest jede Datei in diesem Ordner; die Ausgabe mit `-o` an einen anderen Ort schreiben
cli-emit-folder = der Quelltextordner { $path } { $problem }
cli-emit-folder-link = ist ein symbolischer Link; ampreport schreibt nicht durch Links
cli-emit-folder-link-help = den Ordner selbst benennen oder den Link entfernen
cli-emit-folder-not-a-folder = existiert und ist { $kind }, kein Ordner
cli-emit-folder-new-help = einen neuen oder leeren Ordner angeben
cli-emit-folder-not-empty = ist nicht leer
cli-emit-folder-not-empty-help = einen neuen oder leeren Ordner angeben oder --force hinzufügen, um alles darin zu ersetzen
cli-emit-folder-too-wide = ist das Wurzel-, Home- oder aktuelle Verzeichnis oder enthält das aktuelle Verzeichnis
cli-emit-folder-too-wide-help = einen eigenen Ordner für den Quelltext angeben, etwa `./handover-source`
cli-emit-folder-overlaps = überschneidet sich mit einer Datei oder einem Ordner des Laufs ({ $what }: { $path })
cli-emit-folder-overlaps-help = einen eigenen Ordner für den Quelltext angeben, getrennt vom Auftrag, seinen Eingaben und dem PDF
cli-input-job-file = die Auftragsdatei
cli-input-job-of-run = eine Auftragsdatei dieses Laufs
cli-input-ratings-file = eine Datei mit Röhrendaten
cli-input-shop-profile = das Werkstattprofil
cli-input-photo = ein Foto des Auftrags
cli-input-template-folder = der Vorlagenordner
cli-input-logo = das Logo der Werkstatt
cli-input-translation = die Übersetzungsdatei der Werkstatt
cli-input-typst = das Programm typst
cli-input-pdf-output = die PDF-Ausgabe
cli-kind-fifo = ein FIFO (benannte Pipe)
cli-kind-device = ein Gerät
cli-kind-socket = ein Socket
cli-kind-folder = ein Ordner
cli-kind-link = ein symbolischer Link
cli-kind-other = keine gewöhnliche Datei

## Eine Auftragsdatei, die sich gar nicht lesen lässt (src/input_file.rs,
## ausgegeben von src/cli/load.rs): in der Sprache des Werkstattprofils,
## das für den Ordner des Auftrags gilt, ohne Profil auf Englisch. `$place`
## ist `Datei:Zeile:Spalte`, `$byte` das Byte hexadezimal (0x9f), `$error`
## der Wortlaut des Betriebssystems.

cli-job-file-cannot-read = Fehler: die Auftragsdatei { $path } kann nicht gelesen werden: { $error }
cli-job-file-too-large = Fehler: die Auftragsdatei { $path } ist größer als { $limit } MiB; eine Auftrags- oder Datentabellendatei umfasst wenige Kilobyte, vermutlich ist dies die falsche Datei
cli-job-file-not-utf8 = Fehler: { $place }: die Auftragsdatei ist kein UTF-8-Text (Byte { $byte } an dieser Stelle); bitte im Format UTF-8 speichern

## Die Zeilen von `--verbose`, was woher gelesen wurde (src/cli/ui.rs,
## load.rs, said.rs, render.rs). Zeilen zu einem Auftrag in der Sprache
## seines Werkstattprofils; was vor dem Profil gelesen wird, auf Englisch.

cli-read = gelesen: { $what }: { $from }
cli-read-what-config-folder = Konfigurationsordner
cli-read-what-cache-folder = Cache-Ordner
cli-read-what-ratings = Datentabelle
cli-read-what-shop = Werkstattprofil
cli-read-what-logo = Logo der Werkstatt
cli-read-what-translation = Übersetzung
cli-read-what-job = Auftrag
cli-read-what-template = Vorlage
cli-read-what-typst = typst
cli-read-what-fonts = Schriften
cli-read-what-photo-cache = Foto-Cache
cli-read-from-path = { $path }
cli-read-from-no-home = keiner (kein Home-Ordner in der Umgebung)
cli-read-from-ratings-built-in = eingebaut ({ $count } Typen, im Programm enthalten)
cli-read-from-ratings-file = { $path } (Datentabelle der Werkstatt)
cli-read-from-shop-refused = keines (--no-shop)
cli-read-from-shop-none = keines (kein { $file } neben dem Auftrag oder darüber, kein --shop, keines im Konfigurationsordner)
cli-read-from-shop = { $path } ({ $how ->
        [beside] neben dem Auftrag oder darüber
        [named] mit --shop angegeben
       *[config] aus dem Konfigurationsordner
    })
cli-read-from-job = { $path } ({ $bytes } Bytes)
cli-read-from-stdin = Standardeingabe ({ $bytes } Bytes)
cli-read-from-template-shop = { $path } (Ordner der Werkstatt)
cli-read-from-template-built-in = { $name } (eingebaut, im Programm enthalten)
cli-read-from-typst = { $path } (Version { $version })
cli-read-from-fonts-cache = { $path } (Cache)
cli-read-from-fonts-sandbox = im Programm enthalten, für diesen Lauf geschrieben (kein nutzbarer Cache-Ordner)

## Die Antwort des Betriebssystems auf eine fehlgeschlagene Dateioperation
## (src/catalogue/mod.rs, `os_error`), als `$error` in anderen Meldungen.
## `$detail` sind die eigenen Worte des Systems, unübersetzt.

diag-os-not-found = diese Datei oder dieser Ordner existiert nicht
diag-os-permission-denied = keine Berechtigung
diag-os-is-a-folder = das ist ein Ordner, keine Datei
diag-os-not-a-folder = ein Teil des Pfades ist kein Ordner
diag-os-too-large = die Datei ist zu groß für das Dateisystem
diag-os-already-exists = das existiert bereits
diag-os-disk-full = der Datenträger ist voll
diag-os-read-only = das Dateisystem ist schreibgeschützt
diag-os-ended-early = das endete zu früh
diag-os-interrupted = der Vorgang wurde unterbrochen
diag-os-timed-out = der Vorgang hat zu lange gedauert
diag-os-broken-pipe = das andere Ende der Pipe wurde geschlossen
diag-os-out-of-memory = nicht genug Arbeitsspeicher
diag-os-invalid-data = die Daten sind ungültig ({ $detail })
diag-os-other = { $detail }

## `REV:PATH` über git lesen, für `compare` (src/git/mod.rs), in der
## Sprache des Werkstattprofils für den Ordner von PATH. `$detail` sind
## die eigenen Worte von git, zitiert.

cli-git-missing = der Befehl `git` wird gebraucht, um { $spec } zu lesen, ließ sich aber nicht ausführen: { $error }
cli-git-not-repository = { $spec } kann nicht gelesen werden: dieser Ordner liegt in keinem git-Repository (git sagte: „{ $detail }“)
cli-git-no-revision = { $spec } kann nicht gelesen werden: das Repository hat keine Revision `{ $rev }` (git sagte: „{ $detail }“)
cli-git-not-in-revision = { $spec } kann nicht gelesen werden: `{ $path }` ist in der Revision `{ $rev }` nicht vorhanden (git sagte: „{ $detail }“)
cli-git-failed = git konnte { $spec } nicht lesen: { $detail }
cli-git-timed-out = git brauchte länger als { $seconds } Sekunden, um { $spec } zu lesen
cli-git-interrupted = durch Signal { $signal } angehalten, während git { $spec } las
cli-git-too-large = { $spec } ist größer als { $limit } MiB; eine Auftragsdatei umfasst wenige Kilobyte
cli-git-not-utf8 = { $spec } ist kein UTF-8-Text
