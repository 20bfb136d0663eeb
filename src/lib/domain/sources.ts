/**
 * Citations for every threshold and rule in the domain layer, written as the product shows
 * them. Each says how sure we are of it: a value read in the source itself carries the bare
 * citation; a secondary source, a recollection or a trade habit says so in the text, so a
 * reader never mistakes common practice for a published figure.
 */
export const SOURCES = {
	sperstad2016:
		'Sperstad JB et al. Br J Sports Med 2016;50(17):1092 — ≥ 2 finger widths at any one of three sites (4.5 cm above, at, 4.5 cm below the navel)',
	gluppe2018: 'Gluppe SL et al. Phys Ther 2018;98(4):260–268 — same 2-finger-width rule',
	fingerWidthThresholdPractice:
		'Common practice: two finger widths or more is the usual point for precautions and a physiotherapy referral (no published source)',
	mota2015:
		'Mota P et al. Man Ther 2015;20(1):200–205 — separation present in every primiparous woman at gestation week 35 (ultrasound)',
	mota2015Criterion:
		'Mota P et al. Man Ther 2015;20(1):200–205 — DRA by ultrasound = inter-rectus distance > 16 mm 2 cm below the navel',
	beer2009:
		'Beer GM et al. The normal width of the linea alba in nulliparous women. Clin Anat 2009;22:706–711 — upper limits of normal (90th percentile, ultrasound)',
	ehs2021:
		'Hernández-Granados P et al. European Hernia Society guidelines on management of rectus diastasis. Br J Surg 2021;108(10):1189 — rectus diastasis = separation wider than 2 cm',
	qu2021:
		'Qu E et al. Quant Imaging Med Surg (2021, year from memory) — ultrasound criteria from the 90th percentile of 116 nulliparous women',
	hills2018:
		'Hills NF et al. Phys Ther 2018;98:891–901 — inter-rectus distance ≥ 2.2 cm grouped as DRA at 1 year postpartum',
	reinpold2019:
		'Reinpold W et al. Classification of rectus diastasis. Front Surg 2019;6:1 — W1 < 3 cm, W2 3 to ≤ 5 cm, W3 > 5 cm (W3 seen only in a secondary source)',
	keramidas2022:
		'Keramidas E et al. Aesthetic Plast Surg 2022;46(5):2323–2332 — A 2–3 cm, B 3–5 cm, C 5–7 cm, D 7–9 cm',
	carlstedt2020:
		'Carlstedt A et al. Swedish national guideline recommendations (2020) — surgery considered only at ≥ 5 cm, after 6 months of structured training, ≥ 2 years after the last birth; a suspected hernia needs imaging or surgical review',
	deepOrSoftPractice:
		'Common practice, informed by Lee D, Hodges PW. JOSPT 2016;46(7):580–589 (linea alba distortion): a deep gap or a soft midline on the curl-up calls for a physiotherapist’s look even when narrow',
	domingPractice:
		'Common practice: doming or coning along the midline on effort calls for a physiotherapist’s look (no published source)',
	goom2019RedFlags:
		'Goom T, Donnelly G, Brockwell E. Returning to running postnatal, 2019 — red-flag symptom list (seen via NHS pages, a secondary source)',
	painPractice:
		'Common practice: pain on effort calls for a referral whatever the width (no published source)',
	acog804:
		'ACOG Committee Opinion 804 (2020) — warning signs to stop exercise in pregnancy and seek medical care (from memory, not verified)',
	postnatalCheck:
		'UK Chief Medical Officers’ Physical Activity Guidelines 2019, as restated by NHS pages (secondary source) — the postnatal check at about 6–8 weeks comes before building intensity',
	sperstad2016Prevalence:
		'Sperstad JB et al. Br J Sports Med 2016;50(17):1092 — separation by palpation in 60.0 % of women at 6 weeks postpartum',
	fingerWidthEstimate:
		'Rett MT et al. Rev Bras Fisioter 2009;13(4); Pitangui ACR et al., ABCS Health Sciences — one finger width ≈ 1.5 cm (approximate)',
	trendStepPractice:
		'Trade practice: a change of at most half a finger width (the test’s own step) is steady (no published source)',
	goom2019Running:
		'Goom T, Donnelly G, Brockwell E. Returning to running postnatal, 2019 — return to running not before 3 months (12 weeks) after the birth',
	heavinessPractice:
		'Common practice, in line with Goom T et al. 2019: pelvic heaviness or leakage holds high-pressure effort and impact until a physiotherapist has assessed (no published source for the hold)',
	flexionPractice:
		'Common practice: avoid repeated loaded forward flexion and long-lever abdominal load while a gap is healing, and favour stabilisation work (no published source)',
	pregnancyLoadPractice:
		'Common practice: in pregnancy, doming or a deep gap holds loaded flexion and long-lever load (no published source); width alone holds nothing, as separation is expected late in pregnancy (Mota P et al. Man Ther 2015;20(1):200–205)',
	ucmo2019Postnatal:
		'UK Chief Medical Officers’ Physical Activity Guidelines 2019 — after childbirth, start gently and build up to 150 minutes a week of moderate activity',
	caesareanPractice:
		'Common practice, from memory (not verified): after a caesarean, hold loaded flexion, long-lever and high-pressure work until about 12 weeks',
	caesareanScarSigns:
		'Common practice, from memory (not verified): after a caesarean, scar pain, a bulge at the scar or signs of wound infection are red flags for a doctor',
	niceCg37:
		'NICE CG37 Postnatal care, table 5-1 — signs after the birth that need emergency care (heavy bleeding, chest pain or breathlessness, signs of infection, calf pain or swelling, severe headache)',
	niceCg37LifeThreatening:
		'NICE CG37 Postnatal care — signs of a potentially life-threatening condition that need emergency care (sudden or heavy bleeding, chest pain, sudden breathlessness)',
	fetalMovementsPractice:
		'Common practice, from memory (not verified): the baby moving less than usual needs the maternity unit the same hour, not the next day',
	stuckBulgePractice:
		'Common practice, from memory (not verified): a hard, painful bulge that will not go back in may be a trapped hernia and needs emergency care',
	selfCheckUrgencyPractice:
		'Common practice, from memory (not verified): which signs call for a same-day call to a midwife or doctor rather than emergency care',
	noProvisionalLimit:
		'Seamwell’s provisional rules hold nothing here (each rule names its own source); no clinician’s clearance yet',
	keshwani2016:
		'Keshwani N, Hills N, McLean L. Physiother Can 2016;68(3):223–229 — ultrasound inter-rater minimal detectable change 0.64–1.97 cm, depending on the point; the per-point figures are not in our references, so the largest, 1.97 cm, is used at every point',
	bursch1987:
		'Bursch SG. Phys Ther 1987;67(7):1077–1079 — finger-width scores differ significantly between raters',
	benjamin2020:
		'Benjamin DR et al., Musculoskelet Sci Pract (2020, year from memory) — against ultrasound, finger width agrees only within 18 mm (calipers within 6 mm)'
} as const;

export type SourceKey = keyof typeof SOURCES;
