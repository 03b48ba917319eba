package dev.nitid.stars;

import org.junit.jupiter.api.Test;
import dev.nitid.image.Image;

class DebugTest {
    @Test
    void dump() {
        SyntheticField f = SyntheticField.make(new SyntheticField.Spec(400, 400, 150, 3.0, 3.0, 0, 3.0, 300, 0,
                500, 40000, 0, 60000, 0, 0, true, 0.3, 2.0), 99L);
        StarMeasurement m = StarMeasurer.measure(Image.wrap(400, 400, f.pixels), MeasureSettings.defaults());
        System.out.println(m.timings() + " det=" + m.detections().size() + " fitted=" + m.fitted() + " rej=" + m.rejected());
        System.out.println(m.moffat());
        System.out.println(m.psfReason() + " noise " + m.empirical().noiseToPeak());
        Image e = m.empirical().sampled();
        Image mo = m.modelPsf();
        for (int j = 4; j < 11; j++) {
            StringBuilder sb = new StringBuilder();
            for (int i = 4; i < 11; i++) sb.append(String.format("%7.4f/%7.4f ", e.get(i, j), mo.get(i, j)));
            System.out.println(sb);
        }
    }
}
