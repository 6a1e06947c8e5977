import { loadLanguage } from "@/lib/search/language";
import { snowballStem } from "@/lib/search/stemming";
const t=performance.now(); const l = await loadLanguage(); console.log("ms", Math.round(performance.now()-t), "pairs", l.variantPairs.length);
console.log(l.variantPairs.filter((_,i)=>i%25===0).map(p=>p.join(">")).join(" "));
for (const w of ["grey","colour","stabilise","stabilised","centre","tyre","mould","analyse","vignetting","greyish","harbour","defence","licence","travelled"]) console.log(w, snowballStem(w), "->", l.normaliseStem(snowballStem(w)));
console.log(["seems","flair","lite","roling","gait","peple","infront","numberplate","tshirt","moiray","flikker","brids","sunglases","regrane"].map(w=>w+":"+l.isEnglishWord(w)).join(" "));
