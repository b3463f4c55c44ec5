package org.incipit.core.estimate.ambiguous;

/**
 * A table-driven exponential for the likelihood kernels: within 0.52 ulp of e^x for
 * |x| &le; {@value #FAST_LIMIT} (and {@link Math#exp} outside that range and for NaN), with no
 * branch on the common path and about a dozen floating-point operations.
 *
 * <p><b>Algorithm</b> (Tang 1989, <i>Table-driven implementation of the exponential function
 * in IEEE floating-point arithmetic</i>, ACM TOMS 15(2):144&ndash;157, with N = 128). Write
 * x = (128 e + j) ln2/128 + r with integers e, j (0 &le; j &lt; 128) and |r| &le; ln2/256; then
 * e^x = 2^e &middot; 2^(j/128) &middot; e^r. k = 128 e + j is the integer nearest to x &middot; 128/ln2,
 * r = x &minus; k &middot; ln2/128 is formed with two fused multiply-adds on a two-part ln2/128
 * (the first product is exact), e^r &minus; 1 is its Taylor polynomial of degree 5 (remainder
 * below r^6/720 &le; 5.4e-19, i.e. 0.003 ulp), and 2^(j/128) = T_j (1 + &tau;_j) is held as a
 * double T_j with its relative tail &tau;_j. The result is the single rounding of
 * s + s(&tau;_j + p(r)) with s = 2^e T_j (exact), so the error is one rounding (0.5 ulp) plus
 * terms of order |r| ulp, below 0.52 ulp. The table was computed in 60-digit decimal
 * arithmetic (Newton for 2^(1/128), then powers), not copied from anywhere; it is written out
 * below, and FastExpTest derives it again.
 *
 * <p>Checked against mpmath (correctly rounded values, {@code reference/fast_exp_reference.py})
 * and against {@link StrictMath#exp} on random arguments in FastExpTest.
 */
final class FastExp {

    /** Arguments up to this magnitude take the table path; the result is a normal double. */
    static final double FAST_LIMIT = 708.0;

    private static final int BITS = 7;
    static final int N = 1 << BITS;
    private static final double INV_LN2_N = N / Math.log(2);
    /**
     * ln2/N in two parts: the high part keeps 24 significant bits, so k * LN2_N_HI is exact for
     * |k| &lt; 2^29; T_j = 2^(j/N) rounded to nearest (as bits) and its relative tail
     * tau_j = (2^(j/N) &minus; T_j) / T_j. The values were computed in 60-digit decimal
     * arithmetic (Newton for 2^(1/N), then powers; ln2/N by the atanh series); FastExpTest
     * recomputes them that way and compares bit for bit, so class loading costs no arithmetic.
     */
    static final double LN2_N_HI = 0x1.62e42ep-8;
    static final double LN2_N_LO = 0x1.efa39ef35793cp-32;
    static final long[] SCALE_BITS = {
        0x3FF0000000000000L, 0x3FF0163DA9FB3335L, 0x3FF02C9A3E778061L, 0x3FF04315E86E7F85L,
        0x3FF059B0D3158574L, 0x3FF0706B29DDF6DEL, 0x3FF0874518759BC8L, 0x3FF09E3ECAC6F383L,
        0x3FF0B5586CF9890FL, 0x3FF0CC922B7247F7L, 0x3FF0E3EC32D3D1A2L, 0x3FF0FB66AFFED31BL,
        0x3FF11301D0125B51L, 0x3FF12ABDC06C31CCL, 0x3FF1429AAEA92DE0L, 0x3FF15A98C8A58E51L,
        0x3FF172B83C7D517BL, 0x3FF18AF9388C8DEAL, 0x3FF1A35BEB6FCB75L, 0x3FF1BBE084045CD4L,
        0x3FF1D4873168B9AAL, 0x3FF1ED5022FCD91DL, 0x3FF2063B88628CD6L, 0x3FF21F49917DDC96L,
        0x3FF2387A6E756238L, 0x3FF251CE4FB2A63FL, 0x3FF26B4565E27CDDL, 0x3FF284DFE1F56381L,
        0x3FF29E9DF51FDEE1L, 0x3FF2B87FD0DAD990L, 0x3FF2D285A6E4030BL, 0x3FF2ECAFA93E2F56L,
        0x3FF306FE0A31B715L, 0x3FF32170FC4CD831L, 0x3FF33C08B26416FFL, 0x3FF356C55F929FF1L,
        0x3FF371A7373AA9CBL, 0x3FF38CAE6D05D866L, 0x3FF3A7DB34E59FF7L, 0x3FF3C32DC313A8E5L,
        0x3FF3DEA64C123422L, 0x3FF3FA4504AC801CL, 0x3FF4160A21F72E2AL, 0x3FF431F5D950A897L,
        0x3FF44E086061892DL, 0x3FF46A41ED1D0057L, 0x3FF486A2B5C13CD0L, 0x3FF4A32AF0D7D3DEL,
        0x3FF4BFDAD5362A27L, 0x3FF4DCB299FDDD0DL, 0x3FF4F9B2769D2CA7L, 0x3FF516DAA2CF6642L,
        0x3FF5342B569D4F82L, 0x3FF551A4CA5D920FL, 0x3FF56F4736B527DAL, 0x3FF58D12D497C7FDL,
        0x3FF5AB07DD485429L, 0x3FF5C9268A5946B7L, 0x3FF5E76F15AD2148L, 0x3FF605E1B976DC09L,
        0x3FF6247EB03A5585L, 0x3FF6434634CCC320L, 0x3FF6623882552225L, 0x3FF68155D44CA973L,
        0x3FF6A09E667F3BCDL, 0x3FF6C012750BDABFL, 0x3FF6DFB23C651A2FL, 0x3FF6FF7DF9519484L,
        0x3FF71F75E8EC5F74L, 0x3FF73F9A48A58174L, 0x3FF75FEB564267C9L, 0x3FF780694FDE5D3FL,
        0x3FF7A11473EB0187L, 0x3FF7C1ED0130C132L, 0x3FF7E2F336CF4E62L, 0x3FF80427543E1A12L,
        0x3FF82589994CCE13L, 0x3FF8471A4623C7ADL, 0x3FF868D99B4492EDL, 0x3FF88AC7D98A6699L,
        0x3FF8ACE5422AA0DBL, 0x3FF8CF3216B5448CL, 0x3FF8F1AE99157736L, 0x3FF9145B0B91FFC6L,
        0x3FF93737B0CDC5E5L, 0x3FF95A44CBC8520FL, 0x3FF97D829FDE4E50L, 0x3FF9A0F170CA07BAL,
        0x3FF9C49182A3F090L, 0x3FF9E86319E32323L, 0x3FFA0C667B5DE565L, 0x3FFA309BEC4A2D33L,
        0x3FFA5503B23E255DL, 0x3FFA799E1330B358L, 0x3FFA9E6B5579FDBFL, 0x3FFAC36BBFD3F37AL,
        0x3FFAE89F995AD3ADL, 0x3FFB0E07298DB666L, 0x3FFB33A2B84F15FBL, 0x3FFB59728DE5593AL,
        0x3FFB7F76F2FB5E47L, 0x3FFBA5B030A1064AL, 0x3FFBCC1E904BC1D2L, 0x3FFBF2C25BD71E09L,
        0x3FFC199BDD85529CL, 0x3FFC40AB5FFFD07AL, 0x3FFC67F12E57D14BL, 0x3FFC8F6D9406E7B5L,
        0x3FFCB720DCEF9069L, 0x3FFCDF0B555DC3FAL, 0x3FFD072D4A07897CL, 0x3FFD2F87080D89F2L,
        0x3FFD5818DCFBA487L, 0x3FFD80E316C98398L, 0x3FFDA9E603DB3285L, 0x3FFDD321F301B460L,
        0x3FFDFC97337B9B5FL, 0x3FFE264614F5A129L, 0x3FFE502EE78B3FF6L, 0x3FFE7A51FBC74C83L,
        0x3FFEA4AFA2A490DAL, 0x3FFECF482D8E67F1L, 0x3FFEFA1BEE615A27L, 0x3FFF252B376BBA97L,
        0x3FFF50765B6E4540L, 0x3FFF7BFDAD9CBE14L, 0x3FFFA7C1819E90D8L, 0x3FFFD3C22B8F71F1L
    };
    static final double[] TAIL = {
        0x0.0p0, 0x1.b3b4f1a88bf6ep-54, -0x1.160139cd8dc5dp-56,
        -0x1.05e7a108766d1p-54, 0x1.cd2523567f613p-55, -0x1.bce8023f98efap-55,
        0x1.0f74e61e6c861p-57, 0x1.0a3e45b33d399p-54, 0x1.79aa65d837b6dp-54,
        0x1.eb51a92fdeffcp-55, 0x1.ebe3d702f9cd1p-60, -0x1.a033489906e0bp-57,
        -0x1.556522a2fbd0ep-54, -0x1.080ef8c4eea55p-58, -0x1.1c923b9d5f416p-54,
        0x1.0d3e3e95c55afp-55, -0x1.01b15eaa59348p-55, -0x1.f1ff055de323dp-55,
        0x1.b898c3f1353bfp-55, -0x1.6d99c7611eb26p-54, 0x1.aecf73e3a2f6p-54,
        -0x1.fe782cb86389dp-55, 0x1.a6f4144a6c38dp-55, 0x1.07a05b0e4047dp-55,
        0x1.68efde3a8a894p-54, 0x1.75e18f274487dp-55, 0x1.0472b981fe7f2p-55,
        -0x1.6b87b3f71085ep-54, 0x1.2f7e16d09ab31p-55, -0x1.d219b1a6fbffap-60,
        0x1.b3782720c0ab4p-55, 0x1.e149289cecb8fp-57, 0x1.34d754db0abb6p-55,
        0x1.64201e2ac744cp-55, 0x1.fdd395dd3f84ap-55, -0x1.6a3803b8e5b04p-55,
        -0x1.24aedcc4b5068p-54, -0x1.907f81b512d8ep-54, -0x1.1d1e83e9436d2p-56,
        -0x1.91919b3ce1b15p-54, 0x1.59f48a72a4c6dp-55, -0x1.312607a28698ap-54,
        -0x1.8a78f4817895bp-58, -0x1.c2c9b67499a1bp-56, 0x1.363ed60c2ac11p-59,
        0x1.666093b0664efp-54, 0x1.ecce1daa10379p-57, 0x1.3ff8e3f0f123p-54,
        0x1.690cebb7aafbp-56, 0x1.31dbdeb54e077p-54, -0x1.f94340071a38ep-55,
        -0x1.7deccdc93a349p-55, -0x1.8dec6bd0f385fp-56, -0x1.61246ec7b5cf6p-55,
        0x1.3350518fdd78ep-54, 0x1.b98b72f8a9b05p-56, 0x1.063e1e21c5409p-54,
        0x1.4c7855019c6eap-60, 0x1.432e62b64c035p-54, -0x1.ce44a6199769fp-55,
        -0x1.c33c53bef4da8p-55, -0x1.45378892be9aep-55, -0x1.3cedd78565858p-54,
        0x1.710aa807e1964p-58, -0x1.3b3efbf5e2228p-54, -0x1.a12ad8734b982p-57,
        -0x1.367efb86da9eep-57, -0x1.0dc3d54e08851p-55, -0x1.81f647e5a3ecfp-56,
        -0x1.6ee4ac08b7dbp-55, -0x1.619321e55e68ap-55, 0x1.09ccb5e09d4d3p-54,
        -0x1.b32dcb94da51dp-56, 0x1.4ecfd5467c06bp-54, 0x1.5ebe1abd66c55p-57,
        -0x1.8a1c52fb3cf42p-55, -0x1.369b6f13b3734p-54, -0x1.05e843a19ff1ep-55,
        -0x1.4d450d872576ep-54, 0x1.0ad675b0e8ap-54, 0x1.db72fc1f0eab4p-55,
        -0x1.5b6609cc5e7ffp-57, 0x1.bf68359f35f44p-56, -0x1.3091fa71e3d83p-54,
        -0x1.da9b88b6c1e29p-58, -0x1.c23f97c90b959p-57, -0x1.2434322f4f9aap-54,
        -0x1.5ca6cd7668e4bp-55, 0x1.1affc2b91ce27p-56, 0x1.dd235e10a73bbp-57,
        -0x1.7c50422622263p-55, 0x1.b1c86e3e231d5p-55, -0x1.1bbd1d3bcbb15p-54,
        0x1.0cc319cee31d2p-54, 0x1.469846e735ab3p-55, -0x1.2dfcd978e9db4p-55,
        0x1.c1a7792cb3387p-55, -0x1.07b8f4ad1d9fap-54, -0x1.5c3d956dcaebap-58,
        -0x1.0a40e3da6f64p-54, -0x1.8d6f438ad9334p-57, -0x1.1eee26b588a35p-54,
        0x1.4ffd70a5fddcdp-56, -0x1.1bdfbfa9298acp-54, 0x1.36eae30af0cb3p-56,
        0x1.ee3325c9ffd94p-55, 0x1.4e08fd10959acp-55, 0x1.3cdaf384e1a67p-57,
        0x1.76b2c6c921968p-57, -0x1.08a1883ccb5d2p-55, -0x1.fad5d3ffffa6fp-55,
        -0x1.00dae3875a949p-54, 0x1.4a385a63d07a7p-56, -0x1.2919e2040220fp-55,
        0x1.e5a50d5c192acp-55, 0x1.43a59ac016b4bp-55, -0x1.2d52107b43e1fp-55,
        -0x1.92ab93b470dc9p-55, 0x1.4b604603a88d3p-56, 0x1.3c5ec519d7271p-55,
        -0x1.ff7128fd391fp-55, -0x1.dae98e223747dp-55, 0x1.ec3bc41aa2008p-55,
        0x1.42b94c3a9eb32p-55, 0x1.a64a931d185eep-55, -0x1.e37bae43be3edp-55,
        0x1.7893b4d91cd9dp-56, 0x1.305c14160cc89p-58
    };

    private static final double C2 = 1.0 / 2;
    private static final double C3 = 1.0 / 6;
    private static final double C4 = 1.0 / 24;
    private static final double C5 = 1.0 / 120;

    private FastExp() {
    }

    /**
     * e^x.
     *
     * @param x any double
     * @return e^x within 0.52 ulp for |x| &le; 708; {@link Math#exp} otherwise (so 0, +&infin;,
     *         subnormals and NaN as there)
     */
    static double exp(double x) {
        if (!(Math.abs(x) <= FAST_LIMIT)) {
            return Math.exp(x);
        }
        double kd = Math.rint(x * INV_LN2_N);
        long k = (long) kd;
        double r = Math.fma(-kd, LN2_N_LO, Math.fma(-kd, LN2_N_HI, x));
        int j = (int) (k & (N - 1));
        double s = Double.longBitsToDouble(SCALE_BITS[j] + ((k >> BITS) << 52));
        double r2 = r * r;
        double p = Math.fma(r2, Math.fma(r2, Math.fma(r, C5, C4), Math.fma(r, C3, C2)), r);
        return Math.fma(s, TAIL[j] + p, s);
    }
}
