Attribute VB_Name = "tripoint"
' tripoint for 64-bit Excel on Windows: Declare statements for tripoint.dll
' (build it with cabi/build.sh windows) and worksheet functions of our own.
'
' Units are SI: K, Pa, kg/m3, J/kg, J/(kg K), m/s. Convert in the sheet:
' =TP_PROP("CO2", TP_PT, 30*1E5, 273.15+20, TP_PROP_H)/1000  for kJ/kg.
' A failed call returns #VALUE! (the library returns NaN); TP_LASTMSG in
' the same cell's neighbour is not available: use TP_ERRMSG(...) with the
' same arguments to see the reason.
'
' The DLL cannot be unloaded once loaded; Excel keeps it until it exits.
' Results feed the design of pressure equipment: defer to local codes and
' licensed engineering practice.
Option Explicit

Private Type TpError
    size As Long
    code As Long
    message As String * 256
End Type

Private Declare PtrSafe Function tp_version Lib "tripoint.dll" () As Long
Private Declare PtrSafe Function tp_fluid Lib "tripoint.dll" (ByVal name As String, ByVal ref As Long, ByRef err As TpError) As Long
Private Declare PtrSafe Function tp_prop Lib "tripoint.dll" (ByVal handle As Long, ByVal pair As Long, ByVal a As Double, ByVal b As Double, ByVal prop As Long, ByRef err As TpError) As Double
Private Declare PtrSafe Function tp_table_new Lib "tripoint.dll" (ByVal fluid As Long, ByVal range As LongPtr, ByRef err As TpError) As Long
Private Declare PtrSafe Function tp_table_prop Lib "tripoint.dll" (ByVal table As Long, ByVal pair As Long, ByVal a As Double, ByVal b As Double, ByVal prop As Long, ByRef err As TpError) As Double

' The spline tables built so far, by fluid and reference state; kept until
' Excel exits (a workbook recalculates them often).
Private tables As Collection

' Input pairs (tripoint.h).
Public Const TP_PT As Long = 1
Public Const TP_PH As Long = 2
Public Const TP_PS As Long = 3
Public Const TP_PQ As Long = 4
Public Const TP_TQ As Long = 5
Public Const TP_DU As Long = 6
Public Const TP_HS As Long = 7
Public Const TP_DT As Long = 8

' Property codes (tripoint.h).
Public Const TP_PROP_T As Long = 1
Public Const TP_PROP_P As Long = 2
Public Const TP_PROP_RHO As Long = 3
Public Const TP_PROP_H As Long = 4
Public Const TP_PROP_S As Long = 5
Public Const TP_PROP_U As Long = 6
Public Const TP_PROP_CP As Long = 7
Public Const TP_PROP_CV As Long = 8
Public Const TP_PROP_W As Long = 9
Public Const TP_PROP_QUALITY As Long = 10
Public Const TP_PROP_SOLID As Long = 11
Public Const TP_PROP_PHASE As Long = 12
Public Const TP_PROP_FLAGS As Long = 13
Public Const TP_PROP_V As Long = 14

' TP_PROP returns property prop of fluid (name or alias, e.g. "CO2", "water",
' "R134a"; optional reference state 0..3) at inputs (a, b) of pair.
Public Function TP_PROP(ByVal fluid As String, ByVal pair As Long, ByVal a As Double, ByVal b As Double, ByVal prop As Long, Optional ByVal ref As Long = 0) As Variant
    Dim e As TpError
    e.size = 264
    Dim h As Long
    h = tp_fluid(fluid, ref, e)
    If h <= 0 Then
        TP_PROP = CVErr(xlErrValue)
        Exit Function
    End If
    TP_PROP = cellValue(tp_prop(h, pair, a, b, prop, e), e)
End Function

' cellValue returns v for a cell, or #VALUE! if the call behind it failed.
Private Function cellValue(ByVal v As Double, ByRef e As TpError) As Variant
    If e.code <> 0 Then
        cellValue = CVErr(xlErrValue)
    Else
        cellValue = v
    End If
End Function

' TP_ERRMSG returns the library's message for the same arguments, or "" if
' the call succeeds.
Public Function TP_ERRMSG(ByVal fluid As String, ByVal pair As Long, ByVal a As Double, ByVal b As Double, ByVal prop As Long, Optional ByVal ref As Long = 0) As String
    Dim e As TpError
    e.size = 264
    Dim h As Long
    h = tp_fluid(fluid, ref, e)
    If h > 0 Then
        Dim v As Double
        v = tp_prop(h, pair, a, b, prop, e)
    End If
    If e.code = 0 Then
        TP_ERRMSG = ""
    Else
        TP_ERRMSG = Left$(e.message, InStr(e.message, vbNullChar) - 1)
    End If
End Function

'
' TP_TPROP is TP_PROP answered from spline tables of the fluid: pair TP_PT,
' TP_PH or TP_DU only, within 1e-6 of TP_PROP in T, rho, h and s and many
' times faster (the equation answers near the critical point and outside
' the tables' default range). The first call for a fluid builds its tables,
' which takes about a second.
Public Function TP_TPROP(ByVal fluid As String, ByVal pair As Long, ByVal a As Double, ByVal b As Double, ByVal prop As Long, Optional ByVal ref As Long = 0) As Variant
    Dim e As TpError
    e.size = 264
    Dim t As Long
    t = tableFor(fluid, ref, e)
    If t <= 0 Then
        TP_TPROP = CVErr(xlErrValue)
        Exit Function
    End If
    TP_TPROP = cellValue(tp_table_prop(t, pair, a, b, prop, e), e)
End Function

' tableFor returns the table handle of fluid and ref, built on first use;
' 0 on an error (in e).
Private Function tableFor(ByVal fluid As String, ByVal ref As Long, ByRef e As TpError) As Long
    Dim key As String
    key = LCase$(fluid) & "|" & CStr(ref)
    If tables Is Nothing Then Set tables = New Collection
    On Error Resume Next
    tableFor = tables(key)
    If Err.Number = 0 Then Exit Function
    Err.Clear
    On Error GoTo 0
    Dim h As Long
    h = tp_fluid(fluid, ref, e)
    If h <= 0 Then
        tableFor = 0
        Exit Function
    End If
    tableFor = tp_table_new(h, 0, e)
    If tableFor > 0 Then tables.Add tableFor, key
End Function

' TP_VERSION returns the loaded library's version as MAJOR*10000+MINOR*100+PATCH.
Public Function TP_VERSION() As Long
    TP_VERSION = tp_version()
End Function
