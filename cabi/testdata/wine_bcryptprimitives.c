/* A stand-in for Windows' bcryptprimitives.dll, for the wine test only.
 *
 * The Go runtime asks Windows 10 and later for ProcessPrng from
 * bcryptprimitives.dll; the wine of Debian 12 (8.0) has no such library.
 * This one exports ProcessPrng on top of RtlGenRandom (advapi32), so that
 * tripoint.dll can be loaded under that wine. Real Windows never sees it.
 */
#include <windows.h>
#include <ntsecapi.h>

__declspec(dllexport) BOOL WINAPI ProcessPrng(PBYTE data, SIZE_T n) {
    while (n > 0) {
        ULONG k = n > 0x40000000 ? 0x40000000 : (ULONG)n;
        if (!RtlGenRandom(data, k)) return FALSE;
        data += k;
        n -= k;
    }
    return TRUE;
}
