package dev.nitid.restore;

import dev.nitid.image.Image;
import org.junit.jupiter.api.Test;

class StarProtectionExploreTest {
    @Test
    void explore() {
        Scene sc = new Scene(1, 256, 4.0, 200, 5);
        System.out.printf("stars %d in fwhm %.2f%n", sc.brightStars.size(), sc.fwhm(sc.observed));
        for (Method m : new Method[] {Method.RICHARDSON_LUCY, Method.ACCELERATED_RL}) {
            for (StarProtection p : new StarProtection[] {StarProtection.none(), StarProtection.skyFloor(), StarProtection.ringFloor(), StarProtection.skyFloor().withMarginSigma(1.0), StarProtection.ringFloor().withMarginSigma(0)}) {
                for (Stopping st : new Stopping[] {Stopping.chiSquare(), Stopping.fixed(30)}) {
                    RestoreSettings s = RestoreSettings.defaults().withMethod(m).withProtection(p).withStopping(st);
                    long t = System.nanoTime();
                    RestorationResult r = Restorers.create(s).restore(sc.observed, sc.psf);
                    Image o = r.image();
                    System.out.printf("%-16s %-10s %.1f %-11s it %3d %-22s fwhm %.3f ring %6.2f flux %.3f noise %.2f  %d ms%n",
                            m, p.guard(), p.marginSigma(), st.rule(), r.iterations(), r.stopReason(), sc.fwhm(o) / sc.fwhm(sc.observed),
                            sc.ringDepth(o), sc.fluxRatio(o), sc.noiseRatio(o), (System.nanoTime() - t) / 1000000);
                }
            }
        }
    }
}
